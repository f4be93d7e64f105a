import Database from 'better-sqlite3';
import fc from 'fast-check';
import { connectAsync, type MqttClient } from 'mqtt';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import {
  QUARANTINE_REASONS,
  telemetryTopic,
  type QuarantineReason,
} from '@stillwell/shared/telemetry';
import { IngestionService } from '../src/telemetry/ingestion.service';
import { ACCESS_TEST_ENV } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = DEMO_RESERVOIR.id;
const RUNS = Number(process.env.FUZZ_RUNS ?? 1000);
const MAX_PAYLOAD = 65_536;
const devices = [...new Set(DEMO_RESERVOIR.channels.map((c) => c.deviceId))];
const radar = DEMO_RESERVOIR.channels.find((c) => c.id === 'pool.radar')!;
// measurement times in the recent past, as from a device in the field
const t0 = Date.now() - 10 * 60_000;

const valid = (seq: number) => ({
  deviceId: radar.deviceId,
  channel: radar.id,
  seq,
  time: new Date(t0 + seq * 1000).toISOString(),
  value: (radar.min + radar.max) / 2,
  unit: radar.unit,
  quality: 'good',
});

/** One field of a valid message made wrong, and the reason the shared validation must give. */
const MUTATIONS: ReadonlyArray<{
  field: string;
  values: unknown[];
  reason: QuarantineReason;
}> = [
  { field: 'deviceId', values: [42, '', 'Pool Radar', null], reason: 'bad-shape' },
  { field: 'deviceId', values: ['inflow-gauge', 'no-such-device'], reason: 'device-mismatch' },
  { field: 'channel', values: [7, '', '../x', true], reason: 'bad-shape' },
  { field: 'channel', values: ['no.such.channel'], reason: 'unknown-channel' },
  { field: 'seq', values: [-1, 1.5, '3', null, 2 ** 60], reason: 'bad-shape' },
  {
    field: 'time',
    values: ['yesterday', 1_700_000_000_000, '2026-13-40T00:00:00Z'],
    reason: 'bad-shape',
  },
  {
    field: 'time',
    values: [new Date(Date.now() + 86_400_000).toISOString()],
    reason: 'future-time',
  },
  { field: 'value', values: ['204.5', null, [204.5], { v: 1 }], reason: 'bad-shape' },
  { field: 'value', values: [radar.max + 1000, radar.min - 1000, -1e300], reason: 'out-of-range' },
  { field: 'unit', values: ['furlong', 3, ''], reason: 'bad-shape' },
  { field: 'unit', values: ['m3/s', 'mm/h', '%'], reason: 'wrong-unit' },
  { field: 'quality', values: ['excellent', 1, null], reason: 'bad-shape' },
  { field: 'extra', values: [1, 'x'], reason: 'bad-shape' },
  { field: '(missing)', values: ['deviceId', 'seq', 'time', 'value', 'unit'], reason: 'bad-shape' },
];

interface BadMessage {
  device: string;
  payload: Buffer;
  /** the reason expected, or one of several for random content */
  reasons: readonly QuarantineReason[];
}

const random = {
  bytes: fc
    .record({ device: fc.constantFrom(...devices), bytes: fc.uint8Array({ maxLength: 512 }) })
    .map(({ device, bytes }): BadMessage => ({
      device,
      payload: Buffer.from(bytes),
      reasons: ['not-json', 'bad-shape'],
    })),
  json: fc
    .record({ device: fc.constantFrom(...devices), value: fc.jsonValue({ maxDepth: 4 }) })
    .map(({ device, value }): BadMessage => ({
      device,
      payload: Buffer.from(JSON.stringify(value)),
      reasons: ['bad-shape'],
    })),
  nearValid: fc
    .record({
      m: fc.constantFrom(...MUTATIONS),
      pick: fc.nat(),
      seq: fc.nat({ max: 100_000 }),
    })
    .map(({ m, pick, seq }): BadMessage => {
      const message: Record<string, unknown> = valid(seq);
      const v = m.values[pick % m.values.length];
      if (m.field === '(missing)') delete message[v as string];
      else message[m.field] = v;
      return {
        device: radar.deviceId,
        payload: Buffer.from(JSON.stringify(message)),
        reasons: [m.reason],
      };
    }),
};

describe('MQTT payloads, fuzzed (fast-check): every bad message is counted and quarantined by reason', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let device: MqttClient;
  let ingestion: IngestionService;
  let db: Database.Database;
  const count = (table: string) =>
    (db.prepare(`SELECT COUNT(*) AS n FROM "${table}"`).get() as { n: number }).n;

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      MQTT_MAX_PAYLOAD_BYTES: String(MAX_PAYLOAD),
    });
    ingestion = gateway.app.get(IngestionService);
    device = await connectAsync(broker.url, { clientId: 'fuzz-device', protocolVersion: 4 });
    db = new Database(gateway.databasePath, { readonly: true });
    // a few good readings first: what is already stored must not change
    for (let seq = 0; seq < 5; seq += 1)
      await device.publishAsync(telemetryTopic(RES, radar.deviceId), JSON.stringify(valid(seq)), {
        qos: 1,
      });
    await eventually(() => expect(ingestion.counters.stored).toBe(5));
  });

  afterAll(async () => {
    db?.close();
    await device?.endAsync();
    await gateway?.close();
    await broker?.stop();
  });

  it('quarantines random bytes, random JSON and near-valid telemetry, then keeps ingesting', async () => {
    const sample = (a: fc.Arbitrary<BadMessage>, n: number) =>
      fc.sample(a, { numRuns: n, seed: 7 });
    const bad: BadMessage[] = [
      ...sample(random.bytes, RUNS),
      ...sample(random.json, RUNS),
      ...sample(random.nearValid, 2 * RUNS),
      // over MQTT_MAX_PAYLOAD_BYTES: refused unread, its head kept
      {
        device: radar.deviceId,
        payload: Buffer.alloc(4 * MAX_PAYLOAD, 'x'),
        reasons: ['bad-shape'],
      },
      // a nesting bomb under the limit (RFC 8259 sets no depth; parsers must survive it)
      {
        device: radar.deviceId,
        payload: Buffer.from('['.repeat(30_000) + ']'.repeat(30_000)),
        reasons: ['bad-shape'],
      },
    ];
    const storedRows = () =>
      db.prepare(`SELECT * FROM "readings" ORDER BY id`).all() as Array<Record<string, unknown>>;
    const before = storedRows();
    const quarantinedBefore = count('quarantined_messages');
    const received = ingestion.counters.received;

    for (let i = 0; i < bad.length; i += 50) {
      await Promise.all(
        bad
          .slice(i, i + 50)
          .map((m) => device.publishAsync(telemetryTopic(RES, m.device), m.payload, { qos: 1 })),
      );
    }
    await eventually(
      () => expect(count('quarantined_messages') - quarantinedBefore).toBe(bad.length),
      30_000,
    );

    expect(ingestion.counters.received - received).toBe(bad.length);
    const rows = db
      .prepare(`SELECT reason, detail, payload_bytes FROM "quarantined_messages" ORDER BY id`)
      .all()
      .slice(quarantinedBefore) as Array<{ reason: string; detail: string; payload_bytes: number }>;
    // broker order is publish order for one client at QoS 1 (MQTT 3.1.1, 4.6): row i is message i
    const wrong = rows
      .map((r, i) => ({ r, m: bad[i]! }))
      .filter(({ r, m }) => !m.reasons.includes(r.reason as QuarantineReason) || !r.detail.trim())
      .map(({ r, m }) => `${m.payload.subarray(0, 80).toString()} -> ${r.reason}: ${r.detail}`);
    expect(wrong).toEqual([]);
    for (const r of rows) expect(QUARANTINE_REASONS).toContain(r.reason);
    expect(rows.find((r) => r.payload_bytes === 4 * MAX_PAYLOAD)?.detail).toMatch(
      /over the limit of 65536 bytes/,
    );
    expect(storedRows()).toEqual(before);

    // and valid readings still go in afterwards
    const storedBefore = ingestion.counters.stored;
    for (let seq = 5; seq < 55; seq += 1)
      await device.publishAsync(telemetryTopic(RES, radar.deviceId), JSON.stringify(valid(seq)), {
        qos: 1,
      });
    await eventually(() => expect(ingestion.counters.stored - storedBefore).toBe(50));
    expect(count('readings')).toBe(before.length + 50);
    console.log(`fuzz-mqtt: ${bad.length} bad messages quarantined, then 50 good ones stored`);
  }, 120_000);
});
