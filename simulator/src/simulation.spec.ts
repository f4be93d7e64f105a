import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import {
  ackTopic,
  clockTopic,
  commandTopic,
  siteClockMessageSchema,
  telemetryMessageSchema,
  type TelemetryMessage,
} from '@stillwell/shared/telemetry';
import { connectAsync, type MqttClient } from 'mqtt';
import { afterEach, describe, expect, it } from 'vitest';
import { startBroker } from './broker/broker.js';
import { startSimulation, type Simulation, type SimulationOptions } from './simulation.js';

const RES = DEMO_RESERVOIR.id;
const START = Date.UTC(2030, 0, 1, 6, 0);
const TELEMETRY = `stillwell/v1/${RES}/telemetry/+`;

interface Received {
  topic: string;
  payload: string;
  retain: boolean;
}

/** A real mqtt.js client that records what it receives; `until` resolves once a condition holds. */
async function listen(url: string, topics: string[]) {
  const client: MqttClient = await connectAsync(url, { reconnectPeriod: 0 });
  const received: Received[] = [];
  let waiters: Array<{ done: () => boolean; resolve: () => void }> = [];
  client.on('message', (topic, payload, packet) => {
    received.push({ topic, payload: payload.toString(), retain: packet.retain });
    waiters = waiters.filter((w) => (w.done() ? (w.resolve(), false) : true));
  });
  await client.subscribeAsync(topics, { qos: 1 });
  const until = (done: () => boolean) =>
    done() ? Promise.resolve() : new Promise<void>((resolve) => waiters.push({ done, resolve }));
  return { client, received, until };
}

const telemetryOf = (received: Received[]): TelemetryMessage[] =>
  received
    .filter((r) => r.topic.includes('/telemetry/'))
    .map((r) => telemetryMessageSchema.parse(JSON.parse(r.payload)));

/** True once every channel has reported at plant time `ms` (each device publishes in order). */
const allReportedAt = (received: Received[], ms: number) => {
  const at = new Set(
    telemetryOf(received)
      .filter((m) => Date.parse(m.time) === ms)
      .map((m) => m.channel),
  );
  return DEMO_RESERVOIR.channels.every((c) => at.has(c.id));
};

const running: Array<{ stop(): Promise<void> } | MqttClient> = [];
afterEach(async () => {
  for (const r of running.splice(0).reverse()) {
    await ('endAsync' in r ? r.endAsync(true) : r.stop());
  }
});

async function simulate(options: SimulationOptions = {}): Promise<Simulation> {
  const sim = await startSimulation({
    brokerPort: 0,
    realtime: false,
    startTime: new Date(START + 25_000),
    ...options,
  });
  running.push(sim);
  return sim;
}

describe('startSimulation over MQTT', () => {
  it('publishes schema-valid telemetry, numbered by one per device, on a free loopback port', async () => {
    const sim = await simulate();
    expect(sim.brokerPort).toBeGreaterThan(0);
    const sub = await listen(sim.mqttUrl, [TELEMETRY]);
    running.push(sub.client);
    sim.advance(600);
    await sub.until(() => allReportedAt(sub.received, START + 600_000));

    const messages = telemetryOf(sub.received);
    const byDevice = new Map<string, TelemetryMessage[]>();
    for (const m of messages) byDevice.set(m.deviceId, [...(byDevice.get(m.deviceId) ?? []), m]);
    expect([...byDevice.keys()].sort()).toEqual(
      [...new Set(DEMO_RESERVOIR.channels.map((c) => c.deviceId))].sort(),
    );
    for (const list of byDevice.values()) {
      list.forEach((m, i) => i > 0 && expect(m.seq).toBe(list[i - 1]!.seq + 1));
    }
    for (const c of DEMO_RESERVOIR.channels) {
      const mine = messages.filter((m) => m.channel === c.id);
      // Subscribed after the readings at the start: one per interval after it.
      expect(mine).toHaveLength(600 / c.intervalS);
      expect(mine.every((m) => m.unit === c.unit && m.value >= c.min && m.value <= c.max)).toBe(
        true,
      );
      expect(sub.received.find((r) => r.payload.includes(`"${c.id}"`))?.topic).toBe(
        `stillwell/v1/${RES}/telemetry/${c.deviceId}`,
      );
    }
  });

  it('keeps the plant clock retained, on whole minutes of plant time from the start', async () => {
    const sim = await simulate({ speed: 720 });
    sim.advance(120);
    await sim.flush();
    const late = await listen(sim.mqttUrl, [clockTopic(RES)]);
    running.push(late.client);
    await late.until(() => late.received.length > 0);
    const [first] = late.received;
    expect(first?.retain).toBe(true);
    expect(siteClockMessageSchema.parse(JSON.parse(first!.payload))).toEqual({
      siteTime: new Date(START + 120_000).toISOString(),
      speed: 720,
    });
  });

  it('stops a device in its drop-out window and no other', async () => {
    const sim = await simulate({
      faults: [{ kind: 'dropout', deviceId: 'pool-radar', startHour: 0.05, endHour: 0.1 }],
    });
    const sub = await listen(sim.mqttUrl, [TELEMETRY]);
    running.push(sub.client);
    sim.advance(600);
    await sub.until(() => allReportedAt(sub.received, START + 600_000));
    const seconds = (m: TelemetryMessage) => (Date.parse(m.time) - START) / 1000;
    const radar = telemetryOf(sub.received).filter((m) => m.deviceId === 'pool-radar');
    const pressure = telemetryOf(sub.received).filter((m) => m.deviceId === 'pool-pressure');
    expect(radar.filter((m) => seconds(m) >= 180 && seconds(m) < 360)).toEqual([]);
    expect(radar.map(seconds)).toContain(150);
    expect(radar.map(seconds)).toContain(360);
    expect(pressure.filter((m) => seconds(m) >= 180 && seconds(m) < 360)).toHaveLength(6);
    const resumed = radar.findIndex((m) => seconds(m) === 360);
    expect(radar[resumed]!.seq - radar[resumed - 1]!.seq).toBe(7); // six lost in between
  });

  it('obeys gate commands once per commandId and rejects targets out of range', async () => {
    const sim = await simulate();
    const device = 'gate-controller';
    const sub = await listen(sim.mqttUrl, [TELEMETRY, ackTopic(RES, device)]);
    running.push(sub.client);
    const acks = () =>
      sub.received
        .filter((r) => r.topic === ackTopic(RES, device))
        .map((r) => JSON.parse(r.payload));
    const command = async (body: object, count: number) => {
      await sub.client.publishAsync(commandTopic(RES, device), JSON.stringify(body), { qos: 1 });
      await sub.until(() => acks().length >= count);
      return acks()[count - 1];
    };

    const open = { commandId: 'order-17', gates: { 'gate-1': 1 } };
    expect(await command(open, 1)).toEqual({
      commandId: 'order-17',
      status: 'accepted',
      time: new Date(START).toISOString(),
    });
    sim.advance(60);
    expect(await command(open, 2)).toEqual(acks()[0]);
    const tooFar = await command({ commandId: 'order-18', gates: { 'gate-2': 9.5 } }, 3);
    expect(tooFar).toMatchObject({ commandId: 'order-18', status: 'rejected' });
    expect(tooFar.reason).toMatch(/0\.\.9 m/);
    sim.advance(240);
    await sub.until(() => allReportedAt(sub.received, START + 300_000));

    const gate = (id: string) =>
      telemetryOf(sub.received).filter((m) => m.channel === `gate.${id}.opening`);
    // 0.005 m/s: 1 m in 200 s, reported every 10 s while moving; the repeat did not move it again.
    expect(gate('1').find((m) => Date.parse(m.time) === START + 100_000)?.value).toBe(0.5);
    expect(gate('1').at(-1)?.value).toBe(1);
    expect(sim.plant.targetSettings.gates['gate-1']).toBe(1);
    expect(gate('2').every((m) => m.value === 0)).toBe(true);
  });

  it('refuses a fault for a device the reservoir does not have', async () => {
    await expect(
      simulate({ faults: [{ kind: 'freeze', deviceId: 'pool-raddar', startHour: 1, endHour: 2 }] }),
    ).rejects.toThrow(/no device "pool-raddar"; known: pool-radar/);
  });

  it('connects to a broker of its own choosing, and still stops when that broker has gone', async () => {
    const broker = await startBroker({ port: 0 });
    const sim = await startSimulation({
      broker: false,
      mqttUrl: `mqtt://127.0.0.1:${broker.port}`,
      realtime: false,
    });
    expect(sim.brokerPort).toBeNull();
    sim.advance(600);
    await sim.flush();
    await broker.close();
    sim.advance(600); // published into a dead connection: dropped, not queued
    await sim.stop();
    expect(sim.plant.hourAt(sim.plant.state.timeMs)).toBeCloseTo(1 / 3, 9);
  });
});
