import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { telemetryMessageSchema, type TelemetryMessage } from '@stillwell/shared/telemetry';
import { describe, expect, it } from 'vitest';
import { ReservoirPlant } from '../plant/reservoir-plant.js';
import { createRandom } from '../plant/rng.js';
import { DEMO_STORM } from '../scenarios/demo-storm.js';
import type { DeviceFault } from '../scenarios/scenario.js';
import { channelReaders } from './channels.js';
import { TelemetryDevice } from './telemetry-device.js';

const START = Date.UTC(2030, 0, 1);

/** One device of the demo reservoir, publishing into an array, driven for `seconds` of plant time. */
function run(
  deviceId: string,
  seconds: number,
  opts: {
    faults?: DeviceFault[];
    seed?: number;
    act?: (p: ReservoirPlant) => void;
    log?: (line: string) => void;
  } = {},
) {
  const plant = new ReservoirPlant({
    reservoir: DEMO_RESERVOIR,
    scenario: DEMO_STORM,
    startMs: START,
  });
  const messages: TelemetryMessage[] = [];
  const outbox = {
    publish(topic: string, payload: string) {
      if (topic.includes('/backfill-reply/')) return true;
      messages.push(telemetryMessageSchema.parse(JSON.parse(payload)));
      return true;
    },
  };
  const readers = channelReaders(DEMO_RESERVOIR).filter((r) => r.channel.deviceId === deviceId);
  const ctx = {
    reservoirId: DEMO_RESERVOIR.id,
    faults: opts.faults ?? [],
    startMs: START,
    hourAt: (ms: number) => plant.hourAt(ms),
    reportChangesAfterS: deviceId === 'gate-controller' ? 10 : undefined,
    log: opts.log,
  };
  const device = new TelemetryDevice(deviceId, readers, outbox, ctx, createRandom(opts.seed ?? 1));
  opts.act?.(plant);
  const pool = new Map<string, number>([[new Date(START).toISOString(), plant.state.pool]]);
  device.onStep(plant.state);
  for (let t = 0; t < seconds; t += 10) {
    const state = plant.step(10);
    pool.set(new Date(state.timeMs).toISOString(), state.pool);
    device.onStep(state);
  }
  return { messages, device, plant, pool };
}

const secondsOf = (m: TelemetryMessage) => (Date.parse(m.time) - START) / 1000;

describe('TelemetryDevice', () => {
  it('numbers its messages by one over all its channels, at each channel interval in plant time', () => {
    const { messages } = run('gate-controller', 600);
    expect(messages.map((m) => m.seq)).toEqual(messages.map((_, i) => i));
    const channels = DEMO_RESERVOIR.channels.filter((c) => c.deviceId === 'gate-controller');
    for (const c of channels) {
      const times = messages.filter((m) => m.channel === c.id).map(secondsOf);
      expect(times).toEqual(
        Array.from({ length: 600 / c.intervalS + 1 }, (_, i) => i * c.intervalS),
      );
    }
    expect(
      messages.every(
        (m) => m.quality === 'good' && m.unit === (m.channel === 'outlet.valve' ? '%' : 'm'),
      ),
    ).toBe(true);
  });

  it('gives the two pool gauges small, distinct errors around the true pool', () => {
    const errors = (deviceId: string) => {
      const { messages, pool } = run(deviceId, 6 * 3600);
      return messages.map((m) => m.value - pool.get(m.time)!);
    };
    const mean = (v: number[]) => v.reduce((a, b) => a + b, 0) / v.length;
    const spread = (v: number[]) => Math.sqrt(mean(v.map((x) => (x - mean(v)) ** 2)));
    const radar = errors('pool-radar');
    const pressure = errors('pool-pressure');
    for (const e of [radar, pressure]) {
      expect(Math.abs(mean(e))).toBeLessThan(0.02);
      expect(spread(e)).toBeGreaterThan(0.005);
      expect(spread(e)).toBeLessThan(0.02);
    }
    expect(Math.abs(mean(radar) - mean(pressure))).toBeGreaterThan(0.01);
  });

  it('repeats the same noise for the same seed, and differs for another', () => {
    const a = run('inflow-gauge', 1800).messages.map((m) => m.value);
    expect(run('inflow-gauge', 1800).messages.map((m) => m.value)).toEqual(a);
    expect(run('inflow-gauge', 1800, { seed: 2 }).messages.map((m) => m.value)).not.toEqual(a);
  });

  it('reports a moving gate every 10 plant seconds, then only at its interval', () => {
    const { messages } = run('gate-controller', 900, {
      act: (p) => p.setTargets({ gates: { 'gate-1': 2 } }),
    });
    const gate1 = messages.filter((m) => m.channel === 'gate.1.opening');
    const times = gate1.map(secondsOf);
    // 2 m at 0.005 m/s takes 400 s: a report every step until then, then every 60 s.
    expect(times.slice(0, 41)).toEqual(Array.from({ length: 41 }, (_, i) => i * 10));
    expect(times.slice(41)).toEqual([420, 480, 540, 600, 660, 720, 780, 840, 900]);
    expect(gate1[40]?.value).toBe(2);
  });

  it('loses its messages in a drop-out window, and its sequence shows the gap', () => {
    const fault: DeviceFault = {
      kind: 'dropout',
      deviceId: 'pool-radar',
      startHour: 0.1,
      endHour: 0.2,
    };
    const { messages, device } = run('pool-radar', 1200, { faults: [fault] });
    const times = messages.map(secondsOf);
    expect(times.filter((t) => t >= 360 && t < 720)).toEqual([]);
    expect(times).toContain(330);
    expect(times).toContain(720);
    const after = messages.findIndex((m) => secondsOf(m) === 720);
    expect(messages[after]!.seq - messages[after - 1]!.seq).toBe(1 + device.lost);
    expect(device.lost).toBe(12);
  });

  it('sends readings again on a backfill request, with their seq and time, and answers', () => {
    const { messages, device } = run('pool-radar', 600);
    const produced = messages.length;
    const reply = device.handleBackfill(
      JSON.stringify({ requestId: 'r1', fromSeq: 2, toSeq: produced + 1 }),
    );
    expect(reply).toEqual({
      requestId: 'r1',
      fromSeq: 2,
      toSeq: produced + 1,
      resent: produced - 2,
      unavailable: [{ fromSeq: produced, toSeq: produced + 1, reason: 'not-produced' }],
    });
    const again = messages.slice(produced);
    expect(again).toEqual(messages.slice(2, produced));
    expect(device.stats()).toMatchObject({ resent: produced - 2, backfillRequests: 1 });
  });

  it('ignores a malformed backfill request, naming the field', () => {
    const lines: string[] = [];
    const { device, messages } = run('pool-radar', 60, { log: (l) => lines.push(l) });
    const before = messages.length;
    expect(device.handleBackfill(JSON.stringify({ requestId: 'r', fromSeq: 5, toSeq: 1 }))).toBe(
      null,
    );
    expect(messages).toHaveLength(before);
    expect(lines.join()).toMatch(/toSeq/);
  });

  it('repeats its last value through a freeze, still marked good', () => {
    const fault: DeviceFault = {
      kind: 'freeze',
      deviceId: 'inflow-gauge',
      startHour: 0.5,
      endHour: 1,
    };
    const { messages } = run('inflow-gauge', 5400, { faults: [fault] });
    const inWindow = messages.filter((m) => secondsOf(m) >= 1800 && secondsOf(m) < 3600);
    const before = messages.filter((m) => secondsOf(m) < 1800).at(-1)!;
    expect(inWindow).toHaveLength(30);
    expect(new Set(inWindow.map((m) => m.value))).toEqual(new Set([before.value]));
    expect(inWindow.every((m) => m.quality === 'good')).toBe(true);
    const afterValues = messages.filter((m) => secondsOf(m) >= 3600).map((m) => m.value);
    expect(new Set(afterValues).size).toBeGreaterThan(1);
    expect(messages.map((m) => m.seq)).toEqual(messages.map((_, i) => i));
  });
});
