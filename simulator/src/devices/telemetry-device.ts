import {
  backfillReplyTopic,
  backfillRequestSchema,
  backfillTopic,
  telemetryTopic,
  type BackfillReply,
  type TelemetryMessage,
} from '@stillwell/shared/telemetry';
import type { PlantState } from '../plant/reservoir-plant.js';
import type { Random } from '../plant/rng.js';
import { activeFault } from '../scenarios/faults.js';
import type { DeviceFault } from '../scenarios/scenario.js';
import type { ChannelReader } from './channels.js';
import { ReadingStore } from './reading-store.js';

/** Where a device's messages go. DeviceLink in a run; a plain array in unit tests. */
export interface Outbox {
  publish(topic: string, payload: string, retain?: boolean): boolean;
}

/** A device's link as far as store-and-forward cares; a plain Outbox is always up. */
export type Uplink = Outbox & { readonly connected?: boolean; readonly congested?: boolean };

/** Readings a device keeps for store-and-forward unless told otherwise. */
export const DEFAULT_BUFFER_READINGS = 10_000;

/** What a device has produced, for the ledger (docs/simulator.md, store-and-forward). */
export interface DeviceStats {
  deviceId: string;
  /** readings produced, 0..lastSeq; -1 before the first */
  lastSeq: number;
  /** lost to a drop-out window: never stored, never sent */
  lost: number;
  /** let go by the full buffer before they were sent: lost for good */
  overrunUnsent: number;
  /** waiting in the buffer for the link */
  unsent: number;
  buffered: number;
  /** readings sent again on a backfill request */
  resent: number;
  backfillRequests: number;
}

export interface DeviceContext {
  reservoirId: string;
  faults: readonly DeviceFault[];
  /** scenario hour of a plant time, for the fault windows */
  hourAt(timeMs: number): number;
  /** plant time at the start, epoch ms: reporting intervals count from here */
  startMs: number;
  /**
   * Report by exception: a channel whose value changed is also reported when this many plant
   * seconds have passed since its last report (a gate in motion). Off when not given.
   */
  reportChangesAfterS?: number;
  /** store-and-forward buffer, readings (default DEFAULT_BUFFER_READINGS) */
  bufferReadings?: number;
  log?: (line: string) => void;
}

interface Schedule {
  reader: ChannelReader;
  nextDueMs: number;
  /** true value and plant time of the last report */
  lastTrue?: number;
  lastMs?: number;
}

/**
 * A field device: reads its channels at their own intervals (plant time) and publishes each reading
 * as one telemetry message with the device's next sequence number. Store-and-forward, as field
 * units do: every reading is kept in a bounded buffer first, sent in order while the link is up,
 * kept while it is down (the device goes on measuring), and sent again on a backfill request.
 */
export class TelemetryDevice {
  readonly topic: string;
  readonly backfillTopic: string;
  private readonly replyTopic: string;
  private seq = 0;
  private readonly store: ReadingStore;
  private resendQueue: Array<{ seq: number; payload: string }> = [];
  private readonly queued = new Set<number>();
  private resent = 0;
  private backfillRequests = 0;
  private readonly schedules: Schedule[];
  private readonly last = new Map<string, number>();
  private readonly frozen = new Map<string, number>();
  /** messages lost to a drop-out window (counted, never sent) */
  lost = 0;

  constructor(
    readonly deviceId: string,
    readers: readonly ChannelReader[],
    private readonly outbox: Outbox,
    private readonly ctx: DeviceContext,
    private readonly random: Random,
  ) {
    this.topic = telemetryTopic(ctx.reservoirId, deviceId);
    this.backfillTopic = backfillTopic(ctx.reservoirId, deviceId);
    this.replyTopic = backfillReplyTopic(ctx.reservoirId, deviceId);
    this.store = new ReadingStore(ctx.bufferReadings ?? DEFAULT_BUFFER_READINGS);
    this.schedules = readers.map((reader) => ({ reader, nextDueMs: ctx.startMs }));
  }

  /** Publishes the readings due at this state, at most one per channel. */
  onStep(state: Readonly<PlantState>): void {
    const changeMs =
      this.ctx.reportChangesAfterS === undefined ? null : this.ctx.reportChangesAfterS * 1000;
    for (const s of this.schedules) {
      const trueValue = s.reader.read(state);
      const due = s.nextDueMs <= state.timeMs;
      const changed =
        changeMs !== null &&
        s.lastMs !== undefined &&
        trueValue !== s.lastTrue &&
        state.timeMs - s.lastMs >= changeMs;
      if (!due && !changed) continue;
      if (due) {
        const intervalMs = s.reader.channel.intervalS * 1000;
        // Skip ahead rather than burst when a step is longer than the interval.
        while (s.nextDueMs <= state.timeMs) s.nextDueMs += intervalMs;
      }
      s.lastTrue = trueValue;
      s.lastMs = state.timeMs;
      this.emit(s.reader, trueValue, state.timeMs);
    }
    this.pump();
  }

  /**
   * Sends what waits, oldest first: readings asked for again, then the backlog. Stops while the
   * link is down or congested; called again on every step and when the link comes back.
   */
  pump(): void {
    const link = this.outbox as Uplink;
    const blocked = () => link.connected === false || link.congested === true;
    while (this.resendQueue.length && !blocked()) {
      const next = this.resendQueue[0]!;
      if (!this.outbox.publish(this.topic, next.payload)) return;
      this.resendQueue.shift();
      this.queued.delete(next.seq);
      this.resent++;
    }
    for (let next = this.store.peekUnsent(); next && !blocked(); next = this.store.peekUnsent()) {
      if (!this.outbox.publish(this.topic, next.payload)) return;
      this.store.markSent(next.seq);
    }
  }

  /**
   * A backfill request from the gateway: the readings of the range still held go out again with
   * their original seq and time, and the answer says which parts are gone and why.
   */
  handleBackfill(payload: string): BackfillReply | null {
    let request;
    try {
      request = backfillRequestSchema.parse(JSON.parse(payload));
    } catch (error) {
      this.ctx.log?.(
        `${this.deviceId}: ignored a bad backfill request: ${(error as Error).message}`,
      );
      return null;
    }
    this.backfillRequests++;
    const { resend, unavailable } = this.store.lookup(request.fromSeq, request.toSeq, this.seq - 1);
    for (const r of resend) {
      if (this.queued.has(r.seq)) continue;
      this.queued.add(r.seq);
      this.resendQueue.push(r);
    }
    const reply: BackfillReply = { ...request, resent: resend.length, unavailable };
    this.pump();
    this.outbox.publish(this.replyTopic, JSON.stringify(reply));
    return reply;
  }

  stats(): DeviceStats {
    return {
      deviceId: this.deviceId,
      lastSeq: this.seq - 1,
      lost: this.lost,
      overrunUnsent: this.store.overrunUnsent,
      unsent: this.store.unsentCount,
      buffered: this.store.size,
      resent: this.resent,
      backfillRequests: this.backfillRequests,
    };
  }

  /** nothing waits to be sent */
  get idle(): boolean {
    return this.resendQueue.length === 0 && this.store.peekUnsent() === null;
  }

  private emit(reader: ChannelReader, trueValue: number, timeMs: number): void {
    const { channel } = reader;
    const fault = activeFault(this.ctx.faults, this.deviceId, this.ctx.hourAt(timeMs));
    let value = reader.measure(trueValue, this.random);
    if (fault === 'freeze') {
      // A stuck instrument repeats what it last reported, and still says its reading is good.
      const stuck = this.frozen.get(channel.id) ?? this.last.get(channel.id) ?? value;
      this.frozen.set(channel.id, stuck);
      value = stuck;
    } else {
      this.frozen.delete(channel.id);
    }
    this.last.set(channel.id, value);
    const message: TelemetryMessage = {
      deviceId: this.deviceId,
      channel: channel.id,
      seq: this.seq++,
      time: new Date(timeMs).toISOString(),
      value,
      unit: channel.unit,
      quality: 'good',
    };
    if (fault === 'dropout') {
      // lost in the instrument itself, before the store: the seq is used, the gap is real
      this.lost++;
      return;
    }
    this.store.add(message.seq, JSON.stringify(message));
  }
}
