import { Injectable, OnApplicationBootstrap, OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SchedulerRegistry } from '@nestjs/schedule';
import { InjectRepository } from '@nestjs/typeorm';
import { Subject, type Subscription } from 'rxjs';
import { Repository } from 'typeorm';
import {
  slopePerHour,
  type ChannelState,
  type Quality,
  type ReservoirStatus,
} from '@stillwell/shared/telemetry';
import type { Env } from '../config';
import { SiteClockService } from '../clock/site-clock.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { IngestionService } from './ingestion.service';
import { LatestValues } from './latest-values';
import { Reading } from './reading.entity';

/** Rate of rise is the least-squares slope of the pool over this much site time. */
const RISE_WINDOW_MS = 30 * 60 * 1000;
/** with fewer good pool readings than this in the window, no rate is given */
const RISE_MIN_POINTS = 3;

/** Derives the overview's figures from the latest readings and pushes them at a steady pace. */
@Injectable()
export class StatusService implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly latest = new Map<string, LatestValues>();
  private subscription?: Subscription;
  readonly status$ = new Subject<ReservoirStatus>();

  constructor(
    @InjectRepository(Reading) private readonly readings: Repository<Reading>,
    private readonly ingestion: IngestionService,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly scheduler: SchedulerRegistry,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    const rows: Reading[] = await this.readings
      .createQueryBuilder('r')
      .innerJoin(
        (q) =>
          q
            .select('m.reservoir_id', 'rid')
            .addSelect('m.channel', 'ch')
            .addSelect('MAX(m.time)', 't')
            .from(Reading, 'm')
            .groupBy('m.reservoir_id')
            .addGroupBy('m.channel'),
        'last',
        'last.rid = r.reservoir_id AND last.ch = r.channel AND last.t = r.time',
      )
      .getMany();
    for (const r of rows) {
      this.values(r.reservoirId).update({
        reservoirId: r.reservoirId,
        deviceId: r.deviceId,
        channel: r.channel,
        seq: r.seq,
        t: r.time,
        v: r.value,
        q: r.quality as Quality,
      });
    }
    this.subscription = this.ingestion.stored$.subscribe(({ reservoirId, readings }) => {
      const values = this.values(reservoirId);
      for (const r of readings) values.update(r);
    });
    const every = this.config.get('STATUS_PUSH_MS', { infer: true });
    this.scheduler.addInterval(
      'status-push',
      setInterval(() => this.pushAll(), every),
    );
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
    if (this.scheduler.doesExist('interval', 'status-push'))
      this.scheduler.deleteInterval('status-push');
  }

  pushAll(): void {
    for (const { id } of this.reservoirs.list()) this.status$.next(this.status(id));
  }

  status(reservoirId: string): ReservoirStatus {
    const { definition } = this.reservoirs.get(reservoirId);
    const clock = this.clock.snapshot(reservoirId);
    const values = this.values(reservoirId);
    const channels: ChannelState[] = definition.channels.flatMap((c) => {
      const r = values.get(c.id);
      if (!r) return [];
      const ageS = Math.max(0, (clock.now - r.t) / 1000);
      return [
        {
          channel: c.id,
          deviceId: r.deviceId,
          value: r.v,
          unit: c.unit,
          quality: r.q,
          seq: r.seq,
          t: r.t,
          ageS,
          stale: ageS > c.staleAfterS,
        },
      ];
    });
    const usable = (id: string) =>
      channels.find((c) => c.channel === id && c.quality === 'good' && !c.stale);
    const pool = definition.poolChannels.map(usable).find((c) => c !== undefined);
    const role = (r: string) => {
      const def = definition.channels.find((c) => c.role === r);
      return def ? (usable(def.id)?.value ?? null) : null;
    };
    let rateOfRise: number | null = null;
    if (pool) {
      const points = values.since(pool.channel, clock.now - RISE_WINDOW_MS);
      rateOfRise = points.length >= RISE_MIN_POINTS ? slopePerHour(points) : null;
    }
    const { stored, quarantined, gaps } = this.ingestion.counters;
    return {
      reservoirId,
      clock,
      pool: pool
        ? {
            elevation: pool.value,
            source: pool.channel,
            freeboard: definition.damCrestElevation - pool.value,
            rateOfRise,
          }
        : null,
      inflow: role('inflow'),
      outflow: role('outflow'),
      channels,
      ingestion: { stored, quarantined, gaps },
    };
  }

  private values(reservoirId: string): LatestValues {
    let v = this.latest.get(reservoirId);
    if (!v) this.latest.set(reservoirId, (v = new LatestValues()));
    return v;
  }
}
