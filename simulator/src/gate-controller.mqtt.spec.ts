import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { ruleEventMessageSchema, ruleEventsTopic, rulesTopic } from '@stillwell/shared/orders';
import { ackTopic, commandTopic } from '@stillwell/shared/telemetry';
import { connectAsync, type MqttClient } from 'mqtt';
import { afterEach, describe, expect, it } from 'vitest';
import { startSimulation, type Simulation } from './simulation.js';

const RES = DEMO_RESERVOIR.id;
const DEVICE = 'gate-controller';
const START = Date.UTC(2030, 0, 1, 6, 0);

const running: Array<Simulation | MqttClient> = [];
afterEach(async () => {
  for (const r of running.splice(0).reverse())
    await ('endAsync' in r ? r.endAsync(true) : r.stop());
});

async function setup() {
  const sim = await startSimulation({ brokerPort: 0, realtime: false, startTime: new Date(START) });
  running.push(sim);
  const client = await connectAsync(sim.mqttUrl, { reconnectPeriod: 0 });
  running.push(client);
  const received: Array<{ topic: string; body: Record<string, unknown> }> = [];
  let waiters: Array<() => void> = [];
  client.on('message', (topic, payload) => {
    received.push({ topic, body: JSON.parse(payload.toString()) as Record<string, unknown> });
    const w = waiters;
    waiters = [];
    w.forEach((f) => f());
  });
  await client.subscribeAsync([ackTopic(RES, DEVICE), ruleEventsTopic(RES, DEVICE)], { qos: 1 });
  const until = async (done: () => boolean) => {
    while (!done()) await new Promise<void>((r) => waiters.push(r));
  };
  const on = (topic: string) => received.filter((r) => r.topic === topic).map((r) => r.body);
  return {
    sim,
    client,
    until,
    acks: () => on(ackTopic(RES, DEVICE)),
    events: () => on(ruleEventsTopic(RES, DEVICE)),
  };
}

describe('gate controller over a real broker', () => {
  it('moves the gate once for a command id delivered twice, even after a later command', async () => {
    const { sim, client, until, acks } = await setup();
    const send = (body: object) =>
      client.publishAsync(commandTopic(RES, DEVICE), JSON.stringify(body), { qos: 1 });
    const open = { commandId: 'go-1-0-a1b2', gates: { 'gate-1': 1 } };
    // the broker delivers the same command twice (a QoS 1 redelivery): one move
    await send(open);
    await send(open);
    await until(() => acks().length >= 2);
    expect(acks()[1]).toEqual(acks()[0]);
    sim.advance(300);
    expect(sim.plant.state.settings.gates['gate-1']).toBe(1);

    await send({ commandId: 'go-2-0-c3d4', gates: { 'gate-1': 0.2 } });
    await until(() => acks().length >= 3);
    sim.advance(300);
    expect(sim.plant.state.settings.gates['gate-1']).toBeCloseTo(0.2, 9);
    // the first command arrives again, late: answered as before, the gate stays where it is
    await send(open);
    await until(() => acks().length >= 4);
    expect(acks()[3]).toEqual(acks()[0]);
    sim.advance(300);
    expect(sim.plant.targetSettings.gates['gate-1']).toBeCloseTo(0.2, 9);
    expect(sim.plant.state.settings.gates['gate-1']).toBeCloseTo(0.2, 9);
  });

  it('takes a retained rule set, opens the gate when the pool passes the level, and says so', async () => {
    const { sim, client, until, events } = await setup();
    const pool = sim.plant.state.pool;
    await client.publishAsync(
      rulesTopic(RES, DEVICE),
      JSON.stringify({
        revision: 3,
        rules: [{ control: 'gate-3', enabled: true, riseAbove: pool + 0.05, target: 2 }],
      }),
      { qos: 1, retain: true },
    );
    await until(() => events().some((e) => e.kind === 'applied'));
    expect(events()[0]).toMatchObject({ kind: 'applied', revision: 3 });
    sim.advance(60);
    expect(sim.plant.targetSettings.gates['gate-3']).toBe(0);
    // the demo storm raises the pool; step until it passes the level
    let peak = pool;
    for (let i = 0; i < 2000 && sim.plant.targetSettings.gates['gate-3'] === 0; i++) {
      sim.advance(60);
      peak = Math.max(peak, sim.plant.state.pool);
    }
    expect(peak).toBeGreaterThanOrEqual(pool + 0.05);
    await until(() => events().some((e) => e.kind === 'triggered'));
    const fired = ruleEventMessageSchema.parse(events().find((e) => e.kind === 'triggered'));
    expect(fired).toMatchObject({ control: 'gate-3', target: 2, revision: 3 });
    expect(fired.pool).toBeGreaterThanOrEqual(pool + 0.05);
    expect(sim.plant.targetSettings.gates['gate-3']).toBe(2);
    expect(events().filter((e) => e.kind === 'triggered')).toHaveLength(1);
  });

  it('refuses a bad rule set whole and keeps the rules in force', async () => {
    const { client, until, events } = await setup();
    const publish = (body: object) =>
      client.publishAsync(rulesTopic(RES, DEVICE), JSON.stringify(body), { qos: 1, retain: true });
    await publish({
      revision: 1,
      rules: [{ control: 'gate-2', enabled: true, riseAbove: 230, target: 1 }],
    });
    await publish({
      revision: 2,
      rules: [{ control: 'gate-2', enabled: true, riseAbove: 209, target: 12 }],
    });
    await publish({
      revision: 3,
      rules: [{ control: 'gate-7', enabled: true, riseAbove: 209, target: 1 }],
    });
    await until(() => events().length >= 3);
    expect(events().map((e) => [e.kind, e.revision])).toEqual([
      ['applied', 1],
      ['rejected', 2],
      ['rejected', 3],
    ]);
    expect(events()[1]!.reason).toMatch(/gate-2: target 12 is outside 0\.\.9/);
    expect(events()[2]!.reason).toMatch(/no gate or valve "gate-7"/);
    // leave no retained rules behind on this broker
    await client.publishAsync(rulesTopic(RES, DEVICE), '', { qos: 1, retain: true });
  });
});
