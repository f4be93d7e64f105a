import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import {
  backfillReplySchema,
  backfillTopic,
  telemetryMessageSchema,
  type BackfillReply,
  type TelemetryMessage,
} from '@stillwell/shared/telemetry';
import { connectAsync, type MqttClient } from 'mqtt';
import { afterEach, describe, expect, it } from 'vitest';
import { startBroker } from './broker/broker.js';
import { startSimulation } from './simulation.js';

const RES = DEMO_RESERVOIR.id;
const START = Date.UTC(2030, 0, 1, 6, 0);

const cleanup: Array<() => Promise<unknown>> = [];
afterEach(async () => {
  for (const c of cleanup.splice(0).reverse()) await c();
});

/** A real broker, a listener on it from the start, and the simulation connected to it. */
async function setup() {
  const broker = await startBroker({ port: 0 });
  cleanup.push(() => broker.close());
  const url = `mqtt://127.0.0.1:${broker.port}`;
  const client: MqttClient = await connectAsync(url, { reconnectPeriod: 0 });
  cleanup.push(() => client.endAsync(true));
  const readings: TelemetryMessage[] = [];
  const replies: BackfillReply[] = [];
  let waiters: Array<{ done: () => boolean; resolve: () => void }> = [];
  client.on('message', (topic, payload) => {
    const body: unknown = JSON.parse(payload.toString());
    if (topic.includes('/backfill-reply/')) replies.push(backfillReplySchema.parse(body));
    else readings.push(telemetryMessageSchema.parse(body));
    waiters = waiters.filter((w) => (w.done() ? (w.resolve(), false) : true));
  });
  await client.subscribeAsync(
    [`stillwell/v1/${RES}/telemetry/+`, `stillwell/v1/${RES}/backfill-reply/+`],
    { qos: 1 },
  );
  const until = (done: () => boolean) =>
    done() ? Promise.resolve() : new Promise<void>((resolve) => waiters.push({ done, resolve }));
  const sim = await startSimulation({
    broker: false,
    mqttUrl: url,
    realtime: false,
    startTime: new Date(START),
  });
  cleanup.push(() => sim.stop());
  return { client, readings, replies, until, sim };
}

describe('store-and-forward over a real broker', () => {
  it('answers a backfill request by sending the range again with the original seq and time', async () => {
    const { client, readings, replies, until, sim } = await setup();
    sim.advance(1200);
    const radar = () => readings.filter((r) => r.deviceId === 'pool-radar');
    await until(() => radar().length >= 10);
    const original = radar().filter((r) => r.seq >= 3 && r.seq <= 6);
    expect(original).toHaveLength(4);

    await client.publishAsync(
      backfillTopic(RES, 'pool-radar'),
      JSON.stringify({ requestId: 'ask-1', fromSeq: 3, toSeq: 6 }),
      { qos: 1 },
    );
    await until(() => replies.length === 1);
    expect(replies[0]).toEqual({
      requestId: 'ask-1',
      fromSeq: 3,
      toSeq: 6,
      resent: 4,
      unavailable: [],
    });
    await until(() => radar().filter((r) => r.seq >= 3 && r.seq <= 6).length === 8);
    const again = radar()
      .filter((r) => r.seq >= 3 && r.seq <= 6)
      .slice(4);
    expect(again).toEqual(original);
  });

  it('holds the plant and reports what every device produced, matching what arrived', async () => {
    const { readings, until, sim } = await setup();
    sim.advance(1800);
    const stats = await sim.hold();
    expect(stats.held).toBe(true);
    expect(stats.idle).toBe(true);
    const produced = stats.devices.reduce((n, d) => n + d.lastSeq + 1, 0);
    expect(produced).toBeGreaterThan(50);
    await until(() => readings.length >= produced);
    for (const d of stats.devices) {
      const seqs = readings.filter((r) => r.deviceId === d.deviceId).map((r) => r.seq);
      expect(seqs).toEqual(Array.from({ length: d.lastSeq + 1 }, (_, i) => i));
    }
    // held: advancing no longer happens on its own, and the ledger stays put
    expect(sim.stats().devices).toEqual(stats.devices);
  });
});
