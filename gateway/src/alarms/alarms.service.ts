import {
  Injectable,
  Logger,
  NotFoundException,
  OnApplicationBootstrap,
  OnModuleDestroy,
} from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import { InjectDataSource } from '@nestjs/typeorm';
import type { Subscription } from 'rxjs';
import { DataSource } from 'typeorm';
import {
  AlarmEngine,
  type AlarmCondition,
  type ConditionChange,
  type EngineReading,
  type ForecastOutlook,
  type MassBalanceResult,
} from '@stillwell/shared/alarms';
import type { Quality } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../clock/site-clock.service';
import { ForecastsService } from '../forecasts/forecasts.service';
import { LeaseService } from '../database/lease.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { IngestionService } from '../telemetry/ingestion.service';
import { AlarmStore } from './alarm-store.service';

/** How often (wall ms) silence, shelf expiries and the quarantine are looked at. */
export const ALARM_TICK_MS = 1000;
/**
 * Wall time a feed is given to connect, after the gateway starts watching a reservoir or its site
 * clock first turns out to be simulated, before instruments never heard from count as silent.
 */
export const CONNECT_GRACE_MS = 10_000;
/**
 * The feed counts as delivering while a batch was stored within this much wall time: at 600x a
 * stall of a third of a wall second is three site minutes, which must not read as silence.
 */
export const FEED_ALIVE_WALL_MS = 3000;
/** History the engine is given from the database at start: its longest window and then some. */
const SEED_MS = 12 * 3_600_000;
const QUARANTINE_PAGE = 500;

interface Watched {
  engine: AlarmEngine;
  version: number;
  conditions: ReadonlyMap<string, AlarmCondition>;
  /** wall ms from which the connect grace runs (reset when the site clock turns simulated) */
  graceFromWall: number;
  simulated: boolean;
  /** wall ms of the last stored batch */
  lastBatchWall: number;
}

/** What an external source says about its condition (gate position against its command, ...). */
export interface ExternalDetails {
  message: string;
  value?: number | null;
  limit?: number | null;
}

/**
 * Watches every reservoir for its alarm conditions: one AlarmEngine per reservoir fed with each
 * stored batch, the out-of-range quarantine and the live forecast, judged in site time, and the
 * changes handed to the AlarmStore. Other modules raise their own conditions through raise/clear.
 */
@Injectable()
export class AlarmsService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(AlarmsService.name);
  private readonly watched = new Map<string, Watched>();
  private readonly forecasts = new Map<string, ForecastOutlook | null>();
  private readonly subscriptions: Subscription[] = [];
  private lastQuarantineId = 0;

  constructor(
    readonly store: AlarmStore,
    private readonly ingestion: IngestionService,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly scheduler: SchedulerRegistry,
    private readonly forecastService: ForecastsService,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly lease: LeaseService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    await this.store.load();
    const [row] = (await this.dataSource.query(
      `SELECT MAX(id) AS id FROM quarantined_messages`,
    )) as Array<{ id: number | null }>;
    this.lastQuarantineId = row?.id ?? 0;
    for (const { id } of this.reservoirs.list()) await this.watch(id);
    this.subscriptions.push(
      this.ingestion.stored$.subscribe(({ reservoirId, readings }) => {
        const w = this.watched.get(reservoirId);
        if (!w) return;
        w.lastBatchWall = Date.now();
        w.engine.ingest(readings.map((r) => ({ channel: r.channel, t: r.t, v: r.v, q: r.q })));
        // every gateway keeps its engines fed; the one holding the alarm tick judges
        if (this.lease.holds('alarm-tick')) this.evaluate(reservoirId);
      }),
      this.reservoirs.changed$.subscribe(({ reservoirId }) => void this.watch(reservoirId)),
      this.forecastService.updates$.subscribe(({ reservoirId, run }) =>
        this.acceptForecast(reservoirId, run),
      ),
    );
    this.scheduler.addInterval(
      'alarm-tick',
      setInterval(() => void this.tick(), ALARM_TICK_MS),
    );
  }

  onModuleDestroy(): void {
    for (const s of this.subscriptions) s.unsubscribe();
    if (this.scheduler.doesExist('interval', 'alarm-tick'))
      this.scheduler.deleteInterval('alarm-tick');
  }

  /** The conditions of a reservoir (404 for an unknown reservoir). */
  conditions(reservoirId: string): { version: number; list: readonly AlarmCondition[] } {
    const w = this.watchedOrThrow(reservoirId);
    return { version: w.version, list: w.engine.conditions };
  }

  condition(reservoirId: string, conditionId: string): AlarmCondition {
    const c = this.watchedOrThrow(reservoirId).conditions.get(conditionId);
    if (!c) throw new NotFoundException(`Reservoir "${reservoirId}" has no alarm "${conditionId}"`);
    return c;
  }

  conditionMap(reservoirId: string): ReadonlyMap<string, AlarmCondition> {
    return this.watchedOrThrow(reservoirId).conditions;
  }

  shelveMaxMs(reservoirId: string): number {
    return this.watchedOrThrow(reservoirId).engine.settings.shelveMaxS * 1000;
  }

  massBalance(reservoirId: string): MassBalanceResult | null {
    return this.watched.get(reservoirId)?.engine.lastMassBalance ?? null;
  }

  /**
   * For other modules (the gate orders check gate positions against their commands): raise an
   * external condition of the reservoir, e.g. raise('lake-orrin', 'gate-not-following.gate-2',
   * { message: 'gate 2 at 1.2 m, commanded 4.5 m', value: 1.2, limit: 4.5 }). Resolves true when
   * the alarm was raised by this call, false when it was active already. Unknown reservoirs and
   * conditions, and conditions that are not external, throw.
   */
  raise(reservoirId: string, conditionId: string, details: ExternalDetails): Promise<boolean> {
    return this.external(reservoirId, conditionId, true, details);
  }

  /** The counterpart of raise: the condition is over. */
  clear(reservoirId: string, conditionId: string, details: ExternalDetails): Promise<boolean> {
    return this.external(reservoirId, conditionId, false, details);
  }

  /** One round of the periodic checks; the interval calls it, and tests may. */
  async tick(): Promise<void> {
    if (!(await this.lease.acquire('alarm-tick'))) return;
    await this.readQuarantine();
    for (const reservoirId of this.watched.keys()) {
      const w = this.watched.get(reservoirId)!;
      if (this.reservoirs.find(reservoirId)?.version !== w.version) await this.watch(reservoirId);
      this.evaluate(reservoirId);
      await this.store.expireShelves(reservoirId, this.clock.now(reservoirId));
    }
  }

  private acceptForecast(reservoirId: string, run: ForecastOutlook | null): void {
    this.forecasts.set(reservoirId, run);
    this.watched.get(reservoirId)?.engine.acceptForecast(run);
    this.evaluate(reservoirId);
  }

  private evaluate(reservoirId: string): void {
    const w = this.watched.get(reservoirId);
    if (!w) return;
    const { now, simulated } = this.clock.snapshot(reservoirId);
    if (simulated !== w.simulated) {
      w.simulated = simulated;
      w.graceFromWall = Date.now();
    }
    if (Date.now() - w.graceFromWall < CONNECT_GRACE_MS) w.engine.holdSilence(now);
    if (Date.now() - w.lastBatchWall < FEED_ALIVE_WALL_MS) w.engine.noteFeedAlive(now);
    void this.apply(reservoirId, w, w.engine.evaluate(now));
  }

  private apply(reservoirId: string, w: Watched, changes: ConditionChange[]): Promise<void> {
    if (!changes.length) return Promise.resolve();
    return this.store
      .applyChanges(reservoirId, changes, w.conditions)
      .catch((error: unknown) => this.logger.error(`Recording alarms failed: ${String(error)}`));
  }

  private async external(
    reservoirId: string,
    conditionId: string,
    active: boolean,
    details: ExternalDetails,
  ): Promise<boolean> {
    const w = this.watchedOrThrow(reservoirId);
    const change = w.engine.setExternal(conditionId, active, this.clock.now(reservoirId), details);
    if (!change) return false;
    await this.store.applyChanges(reservoirId, [change], w.conditions);
    return true;
  }

  /**
   * (Re)builds a reservoir's engine on its definition in force, given the recent record from the
   * database and the alarms active when it stopped, so a restart neither forgets nor repeats.
   */
  private async watch(reservoirId: string): Promise<void> {
    const loaded = this.reservoirs.find(reservoirId);
    if (!loaded) return;
    const active = this.store
      .records(reservoirId)
      .filter((r) => r.active)
      .map((r) => r.conditionId);
    const engine = new AlarmEngine(loaded.definition, {
      startMs: this.clock.now(reservoirId),
      active,
    });
    const rows: Array<{ channel: string; time: number; value: number; quality: string }> =
      await this.dataSource.query(
        `SELECT channel, time, value, quality FROM readings WHERE reservoir_id = ? AND time >=
           (SELECT MAX(time) FROM readings WHERE reservoir_id = ?) - ? ORDER BY time`,
        [reservoirId, reservoirId, SEED_MS],
      );
    engine.ingest(
      rows.map((r): EngineReading => ({
        channel: r.channel,
        t: r.time,
        v: r.value,
        q: r.quality as Quality,
      })),
    );
    let forecast = this.forecasts.get(reservoirId);
    if (forecast === undefined) {
      forecast = await this.forecastService.latest(reservoirId).catch(() => null);
      this.forecasts.set(reservoirId, forecast);
    }
    engine.acceptForecast(forecast);
    const previous = this.watched.get(reservoirId);
    this.watched.set(reservoirId, {
      engine,
      version: loaded.version,
      conditions: new Map(engine.conditions.map((c) => [c.id, c])),
      graceFromWall: previous?.graceFromWall ?? Date.now(),
      simulated: previous?.simulated ?? this.clock.snapshot(reservoirId).simulated,
      lastBatchWall: previous?.lastBatchWall ?? 0,
    });
  }

  /** Out-of-range messages from the quarantine, counted per channel at their measurement time. */
  private async readQuarantine(): Promise<void> {
    const rows: Array<{ id: number; reservoir_id: string | null; payload: string }> =
      await this.dataSource.query(
        `SELECT id, reservoir_id, payload FROM quarantined_messages
         WHERE id > ? AND reason = 'out-of-range' ORDER BY id LIMIT ?`,
        [this.lastQuarantineId, QUARANTINE_PAGE],
      );
    for (const row of rows) {
      this.lastQuarantineId = row.id;
      const w = row.reservoir_id ? this.watched.get(row.reservoir_id) : undefined;
      if (!w) continue;
      try {
        const m = JSON.parse(row.payload) as { channel?: unknown; time?: unknown };
        const t = typeof m.time === 'string' ? Date.parse(m.time) : NaN;
        if (typeof m.channel === 'string')
          w.engine.noteOutOfRange(
            m.channel,
            Number.isFinite(t) ? t : this.clock.now(row.reservoir_id!),
          );
      } catch {
        // an out-of-range message was valid JSON when it was judged; a cut payload is skipped
      }
    }
  }

  private watchedOrThrow(reservoirId: string): Watched {
    const w = this.watched.get(reservoirId);
    if (!w) throw new NotFoundException(`No reservoir "${reservoirId}"`);
    return w;
  }
}
