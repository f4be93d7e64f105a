import { Injectable, Logger, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SchedulerRegistry } from '@nestjs/schedule';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { LEASE_TTL_MS, LeaseService } from '../database/lease.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { AggregationService } from './aggregation.service';
import { PruneService } from './prune.service';

const TICK = 'retention-tick';

/**
 * Runs the aggregate job, then the prune job, for every reservoir every RETENTION_TICK_MS of wall
 * time, by each reservoir's site clock. A tick still running makes the next one wait its turn.
 */
@Injectable()
export class RetentionScheduler implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger(RetentionScheduler.name);
  private running: Promise<void> | null = null;

  constructor(
    private readonly aggregation: AggregationService,
    private readonly pruning: PruneService,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly scheduler: SchedulerRegistry,
    private readonly config: ConfigService<Env, true>,
    private readonly lease: LeaseService,
  ) {}

  onApplicationBootstrap(): void {
    const tickMs = this.config.get('RETENTION_TICK_MS', { infer: true });
    if (tickMs > 0)
      this.scheduler.addInterval(
        TICK,
        setInterval(() => void this.tick(), tickMs),
      );
  }

  onModuleDestroy(): void {
    if (this.scheduler.doesExist('interval', TICK)) this.scheduler.deleteInterval(TICK);
  }

  /** The scheduled handler (tests call it, or the jobs, directly). */
  tick(): Promise<void> {
    this.running ??= this.runAll().finally(() => (this.running = null));
    return this.running;
  }

  private async runAll(): Promise<void> {
    // one gateway aggregates and prunes for all; the lease outlasts the interval
    const tickMs = this.config.get('RETENTION_TICK_MS', { infer: true });
    if (!(await this.lease.acquire('retention', Math.max(LEASE_TTL_MS, 2 * tickMs)))) return;
    for (const { id } of this.reservoirs.list()) {
      try {
        await this.aggregation.aggregate(id, this.clock.now(id));
        await this.pruning.prune(id, this.clock.now(id));
      } catch (error) {
        this.logger.error(`Retention of ${id} failed: ${String(error)}`);
      }
    }
  }
}
