import {
  AlarmEngine,
  applyCondition,
  NORMAL,
  type AlarmState,
  type Annunciation,
  type ConditionChange,
  type EngineReading,
} from '@stillwell/shared/alarms';
import { DEMO_RESERVOIR, type ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { validateTelemetry, type TelemetryMessage } from '@stillwell/shared/telemetry';
import { channelReaders, type ChannelReader } from '../devices/channels.js';
import { TelemetryDevice } from '../devices/telemetry-device.js';
import { ReservoirPlant, type Settings } from '../plant/reservoir-plant.js';
import { createRandom, deriveSeed } from '../plant/rng.js';
import { OutlookMaker } from './alarm-outlook.js';
import type { Scenario } from './scenario.js';

export interface AlarmRunOptions {
  scenario: Scenario;
  reservoir?: ReservoirDefinition;
  hours: number;
  seed?: number;
  /** gate and valve orders at scenario hours, as an operator would give them */
  orders?: ReadonlyArray<{ hour: number; change: Partial<Settings> }>;
  /** how often a forecast outlook is made, site s (0: none) */
  forecastEveryS?: number;
  startMs?: number;
}

export interface AlarmRunResult {
  changes: ConditionChange[];
  /** raises presented to the operator (every alarm stays in service in a headless run) */
  annunciations: Annunciation[];
  startMs: number;
  endMs: number;
  engine: AlarmEngine;
  /** the hour of a condition's first raise, null when it was never raised */
  firstRaiseHour(conditionId: string): number | null;
}

const STEP_S = 10;
const JUDGE_EVERY_S = 30;

/**
 * The plant run headless with its instruments, every message passing the gateway's own
 * validation, feeding the alarm engine in site time: what the alarm system would have said about a
 * scenario, without a broker, a gateway or a clock on the wall.
 */
export function runAlarms(o: AlarmRunOptions): AlarmRunResult {
  const reservoir = o.reservoir ?? DEMO_RESERVOIR;
  const startMs = o.startMs ?? Date.UTC(2030, 0, 1);
  const plant = new ReservoirPlant({ reservoir, scenario: o.scenario, startMs });
  const sent: Array<{ deviceId: string; payload: string }> = [];
  const byDevice = new Map<string, ChannelReader[]>();
  for (const r of channelReaders(reservoir)) {
    byDevice.set(r.channel.deviceId, [...(byDevice.get(r.channel.deviceId) ?? []), r]);
  }
  const actuated = new Set(plant.actuators.map((a) => a.channel));
  const devices = [...byDevice].map(([deviceId, readers]) => {
    const outbox = {
      publish: (_topic: string, payload: string) => {
        sent.push({ deviceId, payload });
        return true;
      },
    };
    const moving = readers.some((r) => actuated.has(r.channel.id));
    const ctx = {
      reservoirId: reservoir.id,
      faults: o.scenario.faults,
      startMs,
      hourAt: (ms: number) => plant.hourAt(ms),
      reportChangesAfterS: moving ? 10 : undefined,
    };
    return new TelemetryDevice(
      deviceId,
      readers,
      outbox,
      ctx,
      createRandom(deriveSeed(o.seed ?? 1, deviceId)),
    );
  });
  const engine = new AlarmEngine(reservoir, { startMs });
  const channels = new Map(reservoir.channels.map((c) => [c.id, c]));
  const conditions = new Map(engine.conditions.map((c) => [c.id, c]));
  const states = new Map<string, AlarmState>();
  const changes: ConditionChange[] = [];
  const annunciations: Annunciation[] = [];
  const outlooks = new OutlookMaker(reservoir);
  const inflow: Array<{ t: number; v: number }> = [];
  const latest = new Map<string, number>();
  const inflowChannel = reservoir.channels.find((c) => c.role === 'inflow')?.id;
  const tailwaterChannel = reservoir.channels.find((c) => c.role === 'tailwater')?.id;
  const forecastEveryMs = (o.forecastEveryS ?? 900) * 1000;
  let nextForecast = startMs + forecastEveryMs;
  let nextJudge = startMs;

  const drain = (nowMs: number) => {
    const readings: EngineReading[] = [];
    for (const { deviceId, payload } of sent.splice(0)) {
      const r = validateTelemetry(payload, {
        topicDeviceId: deviceId,
        channels,
        nowMs,
        maxFutureMs: 120_000,
      });
      if (r.ok) {
        readings.push({
          channel: r.reading.channel,
          t: r.reading.timeMs,
          v: r.reading.value,
          q: r.reading.quality,
        });
        latest.set(r.reading.channel, r.reading.value);
        if (r.reading.channel === inflowChannel && r.reading.quality === 'good')
          inflow.push({ t: r.reading.timeMs, v: r.reading.value });
      } else if (r.rejection.reason === 'out-of-range') {
        const m = JSON.parse(payload) as TelemetryMessage;
        engine.noteOutOfRange(m.channel, Date.parse(m.time));
      }
    }
    engine.ingest(readings);
  };

  const forecast = (nowMs: number) => {
    while (inflow.length && inflow[0]!.t < nowMs - 6 * 3_600_000) inflow.shift();
    const pool = latest.get(reservoir.poolChannels[0]!);
    if (pool === undefined) return;
    const openings = { gates: {} as Record<string, number>, valves: {} as Record<string, number> };
    for (const a of plant.actuators) {
      (a.kind === 'gate' ? openings.gates : openings.valves)[a.id] = latest.get(a.channel) ?? 0;
    }
    const tailwater = tailwaterChannel ? (latest.get(tailwaterChannel) ?? null) : null;
    engine.acceptForecast(outlooks.make({ nowMs, pool, inflow, openings, tailwater }));
  };

  devices.forEach((d) => d.onStep(plant.state));
  const steps = Math.round((o.hours * 3600) / STEP_S);
  for (let i = 1; i <= steps; i++) {
    for (const order of o.orders ?? []) {
      if (Math.round((order.hour * 3600) / STEP_S) === i) plant.setTargets(order.change);
    }
    const state = plant.step(STEP_S);
    devices.forEach((d) => d.onStep(state));
    if (state.timeMs < nextJudge) continue;
    nextJudge += JUDGE_EVERY_S * 1000;
    drain(state.timeMs);
    if (forecastEveryMs > 0 && state.timeMs >= nextForecast) {
      nextForecast += forecastEveryMs;
      forecast(state.timeMs);
    }
    for (const change of engine.evaluate(state.timeMs)) {
      changes.push(change);
      const next = applyCondition(states.get(change.conditionId) ?? NORMAL, change.change);
      states.set(change.conditionId, next.state);
      if (next.annunciated) {
        const priority = conditions.get(change.conditionId)!.priority;
        annunciations.push({ conditionId: change.conditionId, timeMs: change.timeMs, priority });
      }
    }
  }
  return {
    changes,
    annunciations,
    startMs,
    endMs: plant.state.timeMs,
    engine,
    firstRaiseHour: (id) => {
      const c = changes.find((x) => x.conditionId === id && x.change === 'raise');
      return c ? (c.timeMs - startMs) / 3_600_000 : null;
    },
  };
}
