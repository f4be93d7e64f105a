import { BadRequestException, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { DamSafety } from '@stillwell/shared/alarms';
import { reservoirDefinitionSchema } from '@stillwell/shared/reservoirs';
import { AlarmsService } from '../alarms/alarms.service';
import { SiteClockService } from '../clock/site-clock.service';
import type { LogbookActor } from '../logbook/logbook.service';
import { LogbookService } from '../logbook/logbook.service';
import { checkDefinition, zodProblems } from '../reservoirs/definition-checks';
import { DEFINITION_CHANGED } from '../reservoirs/definition-upload.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import type { UploadProblem } from '../reservoirs/storage-csv';
import { piezometerSeries, thin, weirSeries, type Points } from './dam-safety-series';

const DAY_MS = 24 * 3_600_000;
const WEEK_MS = 7 * DAY_MS;

export interface LimitsChange {
  seepageWeirs?: unknown[];
  piezometers?: unknown[];
  alarms?: Record<string, unknown>;
}

function refuse(problems: UploadProblem[]): never {
  const errors = problems.filter((p) => p.severity === 'error');
  throw new BadRequestException({
    statusCode: 400,
    error: 'Bad Request',
    message: errors.slice(0, 50).map((p) => p.message),
    problems: errors.slice(0, 200),
  });
}

/** The dam-safety instruments: their record against the pool, and their limits and baselines. */
@Injectable()
export class InstrumentsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly alarms: AlarmsService,
    private readonly logbook: LogbookService,
  ) {}

  async damSafety(
    reservoirId: string,
    range: { from?: string; to?: string; days?: number },
  ): Promise<DamSafety> {
    const { version, definition: def } = this.reservoirs.get(reservoirId);
    const toMs = range.to ? Date.parse(range.to) : this.clock.now(reservoirId);
    const fromMs = range.from
      ? Date.parse(range.from)
      : toMs - (range.days !== undefined ? range.days * DAY_MS : WEEK_MS);
    if (!(fromMs < toMs)) throw new BadRequestException('from must be before to');
    const weirs = def.seepageWeirs ?? [];
    const piezometers = def.piezometers ?? [];
    // the lagged baselines need the pool from well before the range
    const longestLag = Math.max(0, ...[...weirs, ...piezometers].map((x) => x.baseline.lagHours));
    const warmFrom = fromMs - 3 * longestLag * 3_600_000;
    const poolChannel = def.poolChannels[0] ?? null;
    const pool = poolChannel
      ? await this.readings(reservoirId, poolChannel, warmFrom, toMs)
      : { t: [], v: [] };
    const series = async (channel: string) => this.readings(reservoirId, channel, warmFrom, toMs);
    const inRange = (p: Points) => {
      const keep = p.t.map((t) => t >= fromMs);
      return { t: p.t.filter((_, i) => keep[i]), v: p.v.filter((_, i) => keep[i]) };
    };
    return {
      reservoirId,
      definitionVersion: version,
      fromMs,
      toMs,
      pool: { channel: poolChannel, ...thin(inRange(pool)) },
      weirs: await Promise.all(
        weirs.map(async (w) =>
          weirSeries(w, thinFrom(await series(w.channel), fromMs), pool, fromMs),
        ),
      ),
      piezometers: await Promise.all(
        piezometers.map(async (p) =>
          piezometerSeries(p, thinFrom(await series(p.channel), fromMs), pool, fromMs),
        ),
      ),
      massBalance: this.alarms.massBalance(reservoirId),
    };
  }

  /**
   * New seepage-weir, piezometer or alarm limits and baselines: a new version of the definition,
   * checked whole, written with its logbook entry in one transaction (as every definition upload).
   */
  async changeLimits(
    reservoirId: string,
    change: LimitsChange,
    note: string | null,
    actor: LogbookActor,
  ) {
    if (
      change.seepageWeirs === undefined &&
      change.piezometers === undefined &&
      change.alarms === undefined
    )
      refuse([
        {
          field: '(body)',
          row: 0,
          line: null,
          column: null,
          message: '(body): give seepageWeirs, piezometers, alarms or several',
          severity: 'error',
        },
      ]);
    const current = this.reservoirs.get(reservoirId);
    const parsed = reservoirDefinitionSchema.safeParse({ ...current.definition, ...change });
    if (!parsed.success) refuse(zodProblems(parsed.error));
    const problems = checkDefinition(parsed.data);
    if (problems.some((p) => p.severity === 'error')) refuse(problems);
    const changed = Object.keys(change).filter(
      (k) => change[k as keyof LimitsChange] !== undefined,
    );
    let previousVersion: number | null = null;
    const loaded = await this.reservoirs.addVersion(parsed.data, actor.username, {
      change: 'dam-safety',
      note,
      baseVersion: current.version,
      alsoWrite: (tx, version, previous) => {
        previousVersion = previous;
        return this.logbook.append(
          {
            kind: DEFINITION_CHANGED,
            actor,
            payload: {
              reservoirId,
              version,
              previousVersion: previous,
              change: 'dam-safety',
              note,
              changed,
            },
          },
          tx,
        );
      },
    });
    return {
      reservoirId,
      version: loaded.version,
      previousVersion,
      change: 'dam-safety' as const,
      changed,
    };
  }

  private async readings(
    reservoirId: string,
    channel: string,
    fromMs: number,
    toMs: number,
  ): Promise<Points> {
    const rows: Array<{ time: number; value: number }> = await this.dataSource.query(
      `SELECT time, value FROM readings WHERE reservoir_id = ? AND channel = ? AND quality = 'good'
       AND time BETWEEN ? AND ? ORDER BY time`,
      [reservoirId, channel, fromMs, toMs],
    );
    return { t: rows.map((r) => r.time), v: rows.map((r) => r.value) };
  }
}

/** Thins the part of a series in the range, keeping the warm-up before it whole. */
function thinFrom(p: Points, fromMs: number): Points {
  const i = p.t.findIndex((t) => t >= fromMs);
  if (i < 0) return p;
  const tail = thin({ t: p.t.slice(i), v: p.v.slice(i) });
  return { t: [...p.t.slice(0, i), ...tail.t], v: [...p.v.slice(0, i), ...tail.v] };
}
