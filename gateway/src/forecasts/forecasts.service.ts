import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Injectable, Logger, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectRepository } from '@nestjs/typeorm';
import { canonicalize } from 'json-canonicalize';
import { Subject } from 'rxjs';
import { Repository } from 'typeorm';
import {
  FORECAST_CAUTION,
  type ForecastRun,
  type ForecastRunList,
  type ForecastRunSummary,
  type ForecastTrigger,
  type ForecastUpdate,
} from '@stillwell/shared/forecasts';
import { WriteQueueService } from '../database/write-queue.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ForecastInputsService } from './forecast-inputs.service';
import { ForecastRunRow } from './forecast-run.entity';
import { readForecastSettings, type ForecastSettings } from './forecast-settings';
import { computeForecast, ForecastInputError } from './live-forecast';

/** The gateway's own version, read once from its package.json (dist/ and src/ sit beside it). */
function gatewayVersion(): string {
  const pkg = JSON.parse(readFileSync(join(__dirname, '../../package.json'), 'utf8')) as {
    version: string;
  };
  return pkg.version;
}

export const RUN_LIST_LIMIT = 2000;

/**
 * Makes, stores and announces live forecast runs. A run is stored before it is announced, so a
 * console never shows a forecast a reviewer cannot find later. One run at a time per reservoir:
 * a request during a run is folded into one more run right after it.
 */
@Injectable()
export class ForecastsService {
  private readonly logger = new Logger(ForecastsService.name);
  readonly settings: ForecastSettings;
  readonly codeVersion: ForecastRun['codeVersion'];
  readonly updates$ = new Subject<ForecastUpdate>();
  private readonly latestRun = new Map<string, ForecastRun | null>();
  private readonly problems = new Map<string, string | null>();
  private readonly running = new Map<string, Promise<ForecastRun | null>>();
  private readonly again = new Map<string, { trigger: ForecastTrigger; detail: string }>();

  constructor(
    @InjectRepository(ForecastRunRow) private readonly runs: Repository<ForecastRunRow>,
    private readonly reservoirs: ReservoirsService,
    private readonly inputs: ForecastInputsService,
    private readonly writes: WriteQueueService,
    config: ConfigService,
  ) {
    this.settings = readForecastSettings(config);
    this.codeVersion = {
      gateway: gatewayVersion(),
      options: createHash('sha256')
        .update(canonicalize(this.settings.options))
        .digest('hex')
        .slice(0, 16),
    };
  }

  /** Whether a run is under way for the reservoir (the scheduler waits rather than piles up). */
  busy(reservoirId: string): boolean {
    return this.running.has(reservoirId);
  }

  /** Runs now, or right after the run under way; resolves to the stored run (null: none made). */
  run(reservoirId: string, trigger: ForecastTrigger, detail: string): Promise<ForecastRun | null> {
    const current = this.running.get(reservoirId);
    if (current) {
      this.again.set(reservoirId, { trigger, detail });
      return current.then(() => this.running.get(reservoirId) ?? this.latest(reservoirId));
    }
    const job = this.runOnce(reservoirId, trigger, detail).finally(() => {
      this.running.delete(reservoirId);
      const next = this.again.get(reservoirId);
      if (next) {
        this.again.delete(reservoirId);
        void this.run(reservoirId, next.trigger, next.detail);
      }
    });
    this.running.set(reservoirId, job);
    return job;
  }

  private async runOnce(
    reservoirId: string,
    trigger: ForecastTrigger,
    detail: string,
  ): Promise<ForecastRun | null> {
    const { definition, version } = this.reservoirs.get(reservoirId);
    const started = performance.now();
    let computed;
    let state;
    try {
      state = await this.inputs.gather(definition, this.settings.options);
      // the seed names the run, so that anyone can recompute the same ensemble from the inputs
      const seed = `${reservoirId}@${new Date(state.nowMs).toISOString()}`;
      computed = computeForecast(definition, state, this.settings.options, seed);
    } catch (error) {
      const problem =
        error instanceof ForecastInputError
          ? error.message
          : `the forecast failed: ${String(error)}`;
      if (!(error instanceof ForecastInputError)) this.logger.error(problem);
      if (this.problems.get(reservoirId) !== problem) this.logger.warn(`No forecast: ${problem}`);
      this.problems.set(reservoirId, problem);
      this.announce(reservoirId, await this.latest(reservoirId));
      return null;
    }
    const durationMs = Math.round((performance.now() - started) * 10) / 10;
    const { inputs, series, peak, thresholds, timeLeft, holdNow, notes } = computed;
    const row: Omit<ForecastRunRow, 'id'> = {
      reservoirId,
      computedAt: state.nowMs,
      storedAt: Date.now(),
      trigger,
      triggerDetail: detail,
      definitionVersion: version,
      codeVersion: JSON.stringify(this.codeVersion),
      startElevation: inputs.startElevation,
      peakElevation: peak.elevation,
      peakTime: peak.timeMs,
      peakP90: peak.p90,
      timeLeftStatus: timeLeft.status,
      latestStart: timeLeft.latestStartMs,
      inputs: JSON.stringify(inputs),
      outputs: JSON.stringify({ series, peak, thresholds, notes, durationMs }),
      decisions: JSON.stringify({ timeLeft, holdNow }),
    };
    const id = await this.writes.run(async () => {
      const result = await this.runs.insert(row);
      return (result.identifiers[0] as { id: number }).id;
    });
    const run = toRun({ ...row, id });
    this.latestRun.set(reservoirId, run);
    this.problems.set(reservoirId, null);
    this.announce(reservoirId, run);
    return run;
  }

  private announce(reservoirId: string, run: ForecastRun | null): void {
    this.updates$.next(this.update(reservoirId, run));
  }

  update(reservoirId: string, run: ForecastRun | null): ForecastUpdate {
    return {
      reservoirId,
      run,
      problem: this.problems.get(reservoirId) ?? null,
      caution: FORECAST_CAUTION,
    };
  }

  /** The latest stored run (from memory after the first look). */
  async latest(reservoirId: string): Promise<ForecastRun | null> {
    this.reservoirs.get(reservoirId);
    if (this.latestRun.has(reservoirId)) return this.latestRun.get(reservoirId)!;
    const row = await this.runs.findOne({ where: { reservoirId }, order: { id: 'DESC' } });
    const run = row ? toRun(row) : null;
    this.latestRun.set(reservoirId, run);
    return run;
  }

  /** The latest run held in memory, without touching the database (for hot paths). */
  latestCached(reservoirId: string): ForecastRun | null {
    return this.latestRun.get(reservoirId) ?? null;
  }

  async latestUpdate(reservoirId: string): Promise<ForecastUpdate> {
    return this.update(reservoirId, await this.latest(reservoirId));
  }

  /** Summaries of the runs made in [from, to] (site time), oldest first; the latest `limit`. */
  async list(
    reservoirId: string,
    from: number,
    to: number,
    limit: number,
  ): Promise<ForecastRunList> {
    this.reservoirs.get(reservoirId);
    const rows = await this.runs
      .createQueryBuilder('f')
      .select([
        'f.id',
        'f.computedAt',
        'f.trigger',
        'f.triggerDetail',
        'f.definitionVersion',
        'f.startElevation',
        'f.peakElevation',
        'f.peakTime',
        'f.peakP90',
        'f.timeLeftStatus',
        'f.latestStart',
      ])
      .where('f.reservoir_id = :reservoirId', { reservoirId })
      .andWhere('f.computed_at BETWEEN :from AND :to', { from, to })
      .orderBy('f.computed_at', 'DESC')
      .addOrderBy('f.id', 'DESC')
      .limit(limit + 1)
      .getMany();
    const truncated = rows.length > limit;
    const runs: ForecastRunSummary[] = rows
      .slice(0, limit)
      .reverse()
      .map((r) => ({
        id: r.id,
        computedAtMs: r.computedAt,
        trigger: r.trigger as ForecastTrigger,
        triggerDetail: r.triggerDetail,
        definitionVersion: r.definitionVersion,
        startElevation: r.startElevation,
        peakElevation: r.peakElevation,
        peakTimeMs: r.peakTime,
        peakP90: r.peakP90,
        timeLeftStatus: r.timeLeftStatus as ForecastRunSummary['timeLeftStatus'],
        latestStartMs: r.latestStart,
      }));
    return { runs, truncated, caution: FORECAST_CAUTION };
  }

  async get(reservoirId: string, id: number): Promise<ForecastRun> {
    this.reservoirs.get(reservoirId);
    const row = await this.runs.findOneBy({ reservoirId, id });
    if (!row) throw new NotFoundException(`Reservoir "${reservoirId}" has no forecast run ${id}`);
    return toRun(row);
  }
}

function toRun(row: ForecastRunRow): ForecastRun {
  const outputs = JSON.parse(row.outputs) as Pick<
    ForecastRun,
    'series' | 'peak' | 'thresholds' | 'notes' | 'durationMs'
  >;
  const decisions = JSON.parse(row.decisions) as Pick<ForecastRun, 'timeLeft' | 'holdNow'>;
  return {
    id: row.id,
    reservoirId: row.reservoirId,
    computedAtMs: row.computedAt,
    trigger: row.trigger as ForecastTrigger,
    triggerDetail: row.triggerDetail,
    definitionVersion: row.definitionVersion,
    codeVersion: JSON.parse(row.codeVersion) as ForecastRun['codeVersion'],
    inputs: JSON.parse(row.inputs) as ForecastRun['inputs'],
    series: outputs.series,
    peak: outputs.peak,
    thresholds: outputs.thresholds,
    timeLeft: decisions.timeLeft,
    holdNow: decisions.holdNow,
    notes: outputs.notes,
    durationMs: outputs.durationMs,
    caution: FORECAST_CAUTION,
  };
}
