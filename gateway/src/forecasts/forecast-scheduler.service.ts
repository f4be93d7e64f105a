import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { SchedulerRegistry } from '@nestjs/schedule';
import type { Subscription } from 'rxjs';
import type { ForecastTrigger } from '@stillwell/shared/forecasts';
import { SiteClockService } from '../clock/site-clock.service';
import { LeaseService } from '../database/lease.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { IngestionService } from '../telemetry/ingestion.service';
import { ForecastInputsService } from './forecast-inputs.service';
import { ForecastsService } from './forecasts.service';
import { materialChange } from './material-change';

const TICK = 'forecast-tick';
const debounceName = (reservoirId: string) => `forecast-debounce:${reservoirId}`;

interface Pending {
  trigger: ForecastTrigger;
  detail: string;
}

/**
 * When the live forecast is recomputed:
 * - on schedule, once per FORECAST_EVERY_SITE_S of SITE time (a wall interval of
 *   FORECAST_TICK_MS looks at the site clock, which runs 360x faster than the wall in the demo);
 * - when telemetry changes materially (see material-change.ts) or the definition changes, after
 *   FORECAST_DEBOUNCE_MS of wall time so that a burst of readings (a gate travelling) makes one
 *   run. A scheduled run that comes first takes the pending reason with it.
 * Tests call tick() and flushPending() directly.
 */
@Injectable()
export class ForecastScheduler implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(ForecastScheduler.name);
  private readonly subscriptions: Subscription[] = [];
  /** site time of the last run started, per reservoir */
  private readonly lastRunSite = new Map<string, number>();
  private readonly pending = new Map<string, Pending>();

  constructor(
    private readonly forecasts: ForecastsService,
    private readonly inputs: ForecastInputsService,
    private readonly reservoirs: ReservoirsService,
    private readonly ingestion: IngestionService,
    private readonly clock: SiteClockService,
    private readonly scheduler: SchedulerRegistry,
    private readonly lease: LeaseService,
  ) {}

  onApplicationBootstrap(): void {
    this.subscriptions.push(
      this.ingestion.stored$.subscribe(({ reservoirId }) => this.onStored(reservoirId)),
      this.reservoirs.changed$.subscribe(({ reservoirId, version, change }) =>
        this.request(reservoirId, {
          trigger: 'definition',
          detail: `definition version ${version} (${change})`,
        }),
      ),
    );
    const { tickMs } = this.forecasts.settings;
    if (tickMs > 0)
      this.scheduler.addInterval(
        TICK,
        setInterval(() => void this.tick(), tickMs),
      );
  }

  onModuleDestroy(): void {
    for (const s of this.subscriptions) s.unsubscribe();
    if (this.scheduler.doesExist('interval', TICK)) this.scheduler.deleteInterval(TICK);
    for (const reservoirId of this.pending.keys()) this.clearTimer(reservoirId);
  }

  /**
   * The scheduled handler: runs each reservoir whose site clock has entered a new period since
   * its last run. Periods are aligned to the site clock, so at any speed there is one run per
   * site minute (a run can come up to one tick late within its minute).
   */
  async tick(): Promise<void> {
    // one gateway runs the forecasts for all
    if (!(await this.lease.acquire('forecast-tick'))) return;
    const every = this.forecasts.settings.everySiteMs;
    for (const { id } of this.reservoirs.list()) {
      if (this.forecasts.busy(id)) continue;
      const now = this.clock.now(id);
      const last = this.lastRunSite.get(id);
      if (last !== undefined && Math.floor(now / every) <= Math.floor(last / every)) continue;
      const pending = this.takePending(id);
      const reason: Pending =
        pending ??
        (last === undefined
          ? { trigger: 'startup', detail: 'the first run since the gateway started' }
          : { trigger: 'schedule', detail: `every ${every / 1000} s of site time` });
      await this.start(id, reason);
    }
  }

  /** A stored batch for a reservoir: is it a material change from what the last run assumed? */
  onStored(reservoirId: string): void {
    if (this.pending.has(reservoirId) || !this.lease.holds('forecast-tick')) return;
    const loaded = this.reservoirs.find(reservoirId);
    if (!loaded) return;
    const last = this.forecasts.latestCached(reservoirId);
    if (!last) return;
    const detail = materialChange(
      {
        openings: last.inputs.openings,
        inflowNow: last.inputs.inflow.nowFlow,
        series: last.series,
      },
      this.inputs.currentView(loaded.definition, reservoirId),
    );
    if (detail) this.request(reservoirId, { trigger: 'telemetry', detail });
  }

  /** Whether a material change waits for its debounce (for tests and the health of the loop). */
  pendingFor(reservoirId: string): Pending | undefined {
    return this.pending.get(reservoirId);
  }

  /** The debounce handler: runs the pending reason now. */
  async flushPending(reservoirId: string): Promise<void> {
    const pending = this.takePending(reservoirId);
    if (pending) await this.start(reservoirId, pending);
  }

  private request(reservoirId: string, reason: Pending): void {
    if (this.pending.has(reservoirId)) return;
    this.pending.set(reservoirId, reason);
    const { debounceMs } = this.forecasts.settings;
    this.scheduler.addTimeout(
      debounceName(reservoirId),
      setTimeout(() => void this.flushPending(reservoirId), debounceMs),
    );
  }

  private takePending(reservoirId: string): Pending | undefined {
    const pending = this.pending.get(reservoirId);
    this.pending.delete(reservoirId);
    this.clearTimer(reservoirId);
    return pending;
  }

  private clearTimer(reservoirId: string): void {
    const name = debounceName(reservoirId);
    if (this.scheduler.doesExist('timeout', name)) this.scheduler.deleteTimeout(name);
  }

  private async start(reservoirId: string, reason: Pending): Promise<void> {
    this.lastRunSite.set(reservoirId, this.clock.now(reservoirId));
    try {
      await this.forecasts.run(reservoirId, reason.trigger, reason.detail);
    } catch (error) {
      // storing can fail (disk full); the next tick tries again, the loop must not die
      this.logger.error(`Forecast run for ${reservoirId} failed: ${(error as Error).message}`);
    }
  }
}
