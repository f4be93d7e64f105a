import { telemetryTopic, type TelemetryMessage } from '@stillwell/shared/telemetry';
import type { PlantState } from '../plant/reservoir-plant.js';
import type { Random } from '../plant/rng.js';
import { activeFault } from '../scenarios/faults.js';
import type { DeviceFault } from '../scenarios/scenario.js';
import type { ChannelReader } from './channels.js';

/** Where a device's messages go. DeviceLink in a run; a plain array in unit tests. */
export interface Outbox {
  publish(topic: string, payload: string, retain?: boolean): boolean;
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
 * as one telemetry message with the device's next sequence number.
 */
export class TelemetryDevice {
  readonly topic: string;
  private seq = 0;
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
      this.lost++;
      return;
    }
    this.outbox.publish(this.topic, JSON.stringify(message));
  }
}
