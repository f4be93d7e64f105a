import Database from 'better-sqlite3';
import { connectAsync, type MqttClient } from 'mqtt';
import request from 'supertest';
import { io, type Socket } from 'socket.io-client';
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  telemetryTopic,
  type Reading,
} from '@stillwell/shared/telemetry';
import { IngestionService } from '../src/telemetry/ingestion.service';
import { ACCESS_TEST_ENV, signInAs } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = 'lake-orrin';

describe('telemetry path: MQTT -> validation -> SQLite -> socket.io', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let device: MqttClient;
  let socket: Socket;
  // every route and the socket need a signed-in user now: the operator on shift
  let api: ReturnType<typeof request.agent>;
  const pushed: Reading[] = [];
  // measurement times a few minutes in the past, as from a device in the field
  const now = Date.now() - 2 * 60_000;

  const msg = (over: Record<string, unknown> = {}) =>
    JSON.stringify({
      deviceId: 'pool-radar',
      channel: 'pool.radar',
      seq: 0,
      time: new Date(now).toISOString(),
      value: 204.5,
      unit: 'm',
      quality: 'good',
      ...over,
    });
  const publish = (payload: string, deviceId = 'pool-radar', reservoir = RES) =>
    device.publishAsync(telemetryTopic(reservoir, deviceId), payload, { qos: 1 });

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    const operator = await signInAs(gateway, 'operator');
    api = request.agent(gateway.url).set('Authorization', `Bearer ${operator.token}`);
    await eventually(async () => {
      const res = await request(gateway.url).get('/api/health');
      expect(res.body.info?.broker?.status).toBe('up');
    });
    socket = io(`${gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: operator.token },
    });
    socket.on(LIVE_EVENTS.readings, (batch: Reading[]) => pushed.push(...batch));
    const ack = await socket.timeout(5000).emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: RES });
    expect(ack).toEqual({ ok: true });
    device = await connectAsync(broker.url, { clientId: 'test-device', protocolVersion: 4 });
  });

  afterAll(async () => {
    socket?.close();
    await device?.endAsync();
    await gateway?.close();
    await broker?.stop();
  });

  it('stores good readings, quarantines bad ones with reasons, records gaps and pushes live', async () => {
    // good: seq 0, 1, 2, then 5 (3 and 4 missing), a repeat of 2, and a reading in feet
    for (const seq of [0, 1, 2]) {
      await publish(
        msg({ seq, time: new Date(now + seq * 30_000).toISOString(), value: 204.5 + seq / 100 }),
      );
    }
    await publish(msg({ seq: 5, time: new Date(now + 150_000).toISOString(), value: 204.6 }));
    await publish(msg({ seq: 2, time: new Date(now + 60_000).toISOString(), value: 204.52 }));
    await publish(
      msg({ deviceId: 'pool-pressure', channel: 'pool.pressure', seq: 0, unit: 'ft', value: 671 }),
      'pool-pressure',
    );
    // bad, one of each kind
    await publish('{"deviceId": "pool-radar", ');
    await publish(msg({ seq: 'seven' }));
    await publish(msg({ channel: 'pool.sonar' }));
    await publish(msg({ seq: 6, value: 999 }));
    await publish(msg({ seq: 7, time: new Date(Date.now() + 3 * 3600_000).toISOString() }));
    await publish(msg({ seq: 8 }), 'inflow-gauge');
    await publish(msg({ seq: 9, unit: 'm3/s' }));
    await publish(msg({ seq: 10 }), 'pool-radar', 'no-such-lake');

    await eventually(async () => {
      const res = await api.get('/api/telemetry/counters').expect(200);
      expect(res.body.received).toBe(14);
      expect(res.body.stored).toBe(5);
      expect(res.body.repeats).toBe(1);
      expect(res.body.quarantined).toBe(8);
    });
    // counted on arrival, written with the next batch
    await gateway.app.get(IngestionService).flush();

    const db = new Database(gateway.databasePath, { readonly: true });
    try {
      const rows = db
        .prepare(`SELECT device_id, channel, seq, value FROM readings ORDER BY device_id, time`)
        .all() as Array<{ device_id: string; channel: string; seq: number; value: number }>;
      expect(rows.map((r) => `${r.device_id}:${r.seq}`)).toEqual([
        'pool-pressure:0',
        'pool-radar:0',
        'pool-radar:1',
        'pool-radar:2',
        'pool-radar:5',
      ]);
      // stored in the channel's SI unit: 671 ft = 204.5208 m (1 ft = 0.3048 m, NIST SP 811)
      expect(rows[0]!.value).toBeCloseTo(204.5208, 6);

      const quarantined = db
        .prepare(`SELECT reason, detail, payload FROM quarantined_messages ORDER BY id`)
        .all() as Array<{ reason: string; detail: string; payload: string }>;
      expect(quarantined.map((q) => q.reason)).toEqual([
        'not-json',
        'bad-shape',
        'unknown-channel',
        'out-of-range',
        'future-time',
        'device-mismatch',
        'wrong-unit',
        'unknown-reservoir',
      ]);
      expect(quarantined[0]!.payload).toBe('{"deviceId": "pool-radar", ');
      expect(quarantined[1]!.detail).toMatch(/^seq: /);
      expect(quarantined[3]!.detail).toMatch(/999 m is outside the physical range 165\.\.220 m/);

      const gaps = db.prepare(`SELECT device_id, from_seq, to_seq FROM sequence_gaps`).all();
      expect(gaps).toEqual([{ device_id: 'pool-radar', from_seq: 3, to_seq: 4 }]);
    } finally {
      db.close();
    }

    // live: every stored reading that is news, once; never a quarantined one, never the repeat
    await eventually(() => expect(pushed).toHaveLength(5));
    expect(pushed.map((r) => `${r.deviceId}:${r.seq}`).sort()).toEqual([
      'pool-pressure:0',
      'pool-radar:0',
      'pool-radar:1',
      'pool-radar:2',
      'pool-radar:5',
    ]);
    expect(pushed.every((r) => r.v >= 165 && r.v <= 220)).toBe(true);
  });

  it('serves a channel series, the status, the reservoir and the quarantine over REST', async () => {
    const series = await api
      .get(`/api/reservoirs/${RES}/channels/pool.radar/readings`)
      .query({
        from: new Date(now - 1000).toISOString(),
        to: new Date(now + 200_000).toISOString(),
      })
      .expect(200);
    expect(series.body.t).toEqual([0, 30_000, 60_000, 150_000].map((d) => now + d));
    expect(series.body.v[3]).toBeCloseTo(204.6, 9);
    expect(series.body.unit).toBe('m');

    const status = await api.get(`/api/reservoirs/${RES}/status`).expect(200);
    expect(status.body.pool.source).toBe('pool.radar');
    expect(status.body.pool.elevation).toBeCloseTo(204.6, 9);
    expect(status.body.pool.freeboard).toBeCloseTo(212 - 204.6, 9);

    const def = await api.get(`/api/reservoirs/${RES}`).expect(200);
    expect(def.body.definition.damName).toBe('Orrin Gap Dam');

    const q = await api.get('/api/telemetry/quarantine').query({ limit: 3 }).expect(200);
    expect(q.body).toHaveLength(3);
    expect(q.body[0].reason).toBe('unknown-reservoir');
  });

  it('answers bad queries with a 400 that names the field, and unknown things with a 404', async () => {
    const bad = await api
      .get(`/api/reservoirs/${RES}/channels/pool.radar/readings`)
      .query({ from: 'last tuesday' })
      .expect(400);
    expect(JSON.stringify(bad.body.message)).toMatch(/from/);
    await api.get(`/api/reservoirs/${RES}/channels/nope/readings`).expect(404);
    await api.get('/api/reservoirs/nowhere').expect(404);
    const extra = await api
      .get(`/api/reservoirs/${RES}/channels/pool.radar/readings`)
      .query({ sneaky: 1 })
      .expect(400);
    expect(JSON.stringify(extra.body.message)).toMatch(/sneaky/);
  });

  it('refuses a socket subscription to an unknown reservoir', async () => {
    const ack = await socket
      .timeout(5000)
      .emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: 'nowhere' });
    expect(ack).toEqual({ ok: false, error: 'No reservoir "nowhere"' });
    const malformed = await socket.timeout(5000).emitWithAck(LIVE_EVENTS.subscribe, { id: 1 });
    expect(malformed.ok).toBe(false);
  });

  it('serves the OpenAPI document', async () => {
    const res = await api.get('/api/docs-json').expect(200);
    expect(Object.keys(res.body.paths)).toEqual(
      expect.arrayContaining(['/api/reservoirs', '/api/reservoirs/{id}/status', '/api/health']),
    );
  });
});
