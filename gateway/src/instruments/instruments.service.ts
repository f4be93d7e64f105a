import { BadRequestException, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { DamSafety } from '@stillwell/shared/alarms';
import { AlarmsService } from '../alarms/alarms.service';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { piezometerSeries, thin, weirSeries, type Points } from './dam-safety-series';

const DAY_MS = 24 * 3_600_000;
const WEEK_MS = 7 * DAY_MS;

/**
 * The dam-safety instruments' record against the pool, with their limits and baselines (which
 * change through POST definition/limits, in the reservoirs module).
 */
@Injectable()
export class InstrumentsService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly alarms: AlarmsService,
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
