import { Injectable, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import { Subject, type Subscription } from 'rxjs';
import type { Reading } from '@stillwell/shared/telemetry';
import { IngestionService } from '../telemetry/ingestion.service';

interface Point {
  t: number;
  v: number;
}

/** A change between two position reports smaller than this is encoder noise, not travel. */
const STILL = { m: 0.001, '%': 0.05 } as const;
/** Two differing reports within this much site time mean the gate is moving. */
const MOVING_WINDOW_MS = 60_000;

/**
 * The last few position reports of every gate and valve channel, as they are stored. The status
 * service says whether a reading is fresh; this says whether the gate is moving, which needs two.
 */
@Injectable()
export class ActuatorPositions implements OnModuleInit, OnModuleDestroy {
  private readonly recent = new Map<string, Point[]>();
  private subscription?: Subscription;
  /** every stored batch that held a position report, for the order progress check */
  readonly updated$ = new Subject<string>();
  private channels = new Set<string>();

  constructor(private readonly ingestion: IngestionService) {}

  /** The channels worth keeping (gate and valve positions); set by the orders module. */
  watch(reservoirId: string, channels: readonly string[]): void {
    for (const c of channels) this.channels.add(`${reservoirId}/${c}`);
  }

  onModuleInit(): void {
    this.subscription = this.ingestion.stored$.subscribe(({ reservoirId, readings }) =>
      this.accept(reservoirId, readings),
    );
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
    this.updated$.complete();
  }

  accept(reservoirId: string, readings: readonly Reading[]): void {
    let any = false;
    for (const r of readings) {
      const key = `${reservoirId}/${r.channel}`;
      if (!this.channels.has(key) || r.q !== 'good') continue;
      const list = this.recent.get(key) ?? [];
      if (list.length && list[list.length - 1]!.t >= r.t) continue;
      list.push({ t: r.t, v: r.v });
      if (list.length > 8) list.shift();
      this.recent.set(key, list);
      any = true;
    }
    if (any) this.updated$.next(reservoirId);
  }

  /** The latest good report, or undefined. */
  latest(reservoirId: string, channel: string): Point | undefined {
    return this.recent.get(`${reservoirId}/${channel}`)?.at(-1);
  }

  /**
   * How far the gate moved between its last two reports, when they are recent and differ by more
   * than encoder noise; null when it is at rest (or there is only one report).
   */
  movement(
    reservoirId: string,
    channel: string,
    unit: 'm' | '%',
    siteNowMs: number,
  ): { from: number; to: number } | null {
    const list = this.recent.get(`${reservoirId}/${channel}`) ?? [];
    const last = list.at(-1);
    const before = list.at(-2);
    if (!last || !before || siteNowMs - last.t > MOVING_WINDOW_MS) return null;
    return Math.abs(last.v - before.v) > STILL[unit] ? { from: before.v, to: last.v } : null;
  }
}
