import Database from 'better-sqlite3';
import { connectAsync, type MqttClient } from 'mqtt';
import {
  backfillReplyTopic,
  backfillRequestSchema,
  backfillTopic,
  telemetryTopic,
  type BackfillReply,
  type BackfillRequest,
  type TelemetryMessage,
} from '@stillwell/shared/telemetry';
import { IngestionService } from '../src/telemetry/ingestion.service';
import { ACCESS_TEST_ENV } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = 'lake-orrin';
const T0 = Date.now() - 30 * 60_000;

/**
 * A field device made of the shared schemas: it numbers its readings, can be told to hold some
 * back (lost on the way), and answers backfill requests from what it still holds.
 */
class ScriptedDevice {
  readonly requests: BackfillRequest[] = [];
  private readonly held = new Map<number, string>();
  private produced = 0;
  /** sequence numbers it says it no longer has */
  forgotten = new Set<number>();
  silent = false;

  constructor(
    readonly deviceId: string,
    readonly channel: string,
    private readonly client: MqttClient,
    readonly unit: TelemetryMessage['unit'] = 'm',
  ) {}

  async start(): Promise<void> {
    this.client.on('message', (topic, payload) => {
      if (topic === backfillTopic(RES, this.deviceId)) void this.answer(payload.toString());
    });
    await this.client.subscribeAsync(backfillTopic(RES, this.deviceId), { qos: 1 });
  }

  get lastSeq(): number {
    return this.produced - 1;
  }

  /** Produces `n` readings; those with `lose(seq)` true never reach the broker. */
  async produce(n: number, lose: (seq: number) => boolean = () => false): Promise<void> {
    for (let i = 0; i < n; i++) {
      const seq = this.produced++;
      const message: TelemetryMessage = {
        deviceId: this.deviceId,
        channel: this.channel,
        seq,
        time: new Date(T0 + seq * 1000).toISOString(),
        value: 204 + seq / 1000,
        unit: this.unit,
        quality: 'good',
      };
      const payload = JSON.stringify(message);
      if (!this.forgotten.has(seq)) this.held.set(seq, payload);
      if (!lose(seq)) await this.send(payload);
    }
  }

  private send(payload: string) {
    return this.client.publishAsync(telemetryTopic(RES, this.deviceId), payload, { qos: 1 });
  }

  private async answer(text: string): Promise<void> {
    const request = backfillRequestSchema.parse(JSON.parse(text));
    this.requests.push(request);
    if (this.silent) return;
    let resent = 0;
    const unavailable: BackfillReply['unavailable'] = [];
    for (let seq = request.fromSeq; seq <= request.toSeq; seq++) {
      const payload = this.held.get(seq);
      if (payload) {
        await this.send(payload);
        resent++;
      } else {
        const last = unavailable.at(-1);
        if (last && last.toSeq === seq - 1) last.toSeq = seq;
        else unavailable.push({ fromSeq: seq, toSeq: seq, reason: 'not-held' });
      }
    }
    const reply: BackfillReply = { ...request, resent, unavailable };
    await this.client.publishAsync(backfillReplyTopic(RES, this.deviceId), JSON.stringify(reply), {
      qos: 1,
    });
  }
}

describe('backfill: the gateway asks a device for what it missed (real broker, real SQLite)', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let client: MqttClient;

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      BACKFILL_MAX_SEQS: '7',
      BACKFILL_ATTEMPTS: '2',
      BACKFILL_RETRY_MS: '300',
    });
    client = await connectAsync(broker.url, { clientId: 'scripted-field', protocolVersion: 4 });
  });

  afterAll(async () => {
    await client?.endAsync();
    await gateway?.close();
    await broker?.stop();
  });

  const db = () => new Database(gateway.databasePath, { readonly: true });
  const seqsOf = (deviceId: string): number[] => {
    const d = db();
    try {
      return (
        d
          .prepare('SELECT seq FROM readings WHERE device_id = ? ORDER BY seq')
          .all(deviceId) as Array<{ seq: number }>
      ).map((r) => r.seq);
    } finally {
      d.close();
    }
  };
  const gapsOf = (deviceId: string) => {
    const d = db();
    try {
      return d
        .prepare(
          'SELECT from_seq, to_seq, state, attempts, detail FROM sequence_gaps WHERE device_id = ? ORDER BY id',
        )
        .all(deviceId) as Array<{
        from_seq: number;
        to_seq: number;
        state: string;
        attempts: number;
        detail: string | null;
      }>;
    } finally {
      d.close();
    }
  };
  const range = (n: number) => Array.from({ length: n }, (_, i) => i);

  it('fills a gap in bounded parts: every reading stored once, the gap marked filled', async () => {
    const device = new ScriptedDevice('pool-radar', 'pool.radar', client);
    await device.start();
    // 10..29 are lost on the way: a gap of 20, asked for in parts of at most 7
    await device.produce(40, (seq) => seq >= 10 && seq < 30);
    await eventually(() => expect(gapsOf('pool-radar')[0]?.state).toBe('filled'), 20_000);
    expect(seqsOf('pool-radar')).toEqual(range(device.lastSeq + 1));
    expect(gapsOf('pool-radar')).toEqual([
      { from_seq: 10, to_seq: 29, state: 'filled', attempts: 3, detail: null },
    ]);
    expect(device.requests.map((r) => [r.fromSeq, r.toSeq])).toEqual([
      [10, 16],
      [17, 23],
      [24, 29],
    ]);
  });

  it('stores a reading delivered twice once', async () => {
    const device = new ScriptedDevice('inflow-gauge', 'inflow', client, 'm3/s');
    await device.start();
    await device.produce(5);
    // the same five again, as a broker redelivers after a lost acknowledgement
    const replay = new ScriptedDevice('inflow-gauge', 'inflow', client, 'm3/s');
    await replay.produce(5);
    await eventually(() => expect(gateway.app.get(IngestionService).counters.repeats).toBe(5));
    expect(seqsOf('inflow-gauge')).toEqual(range(5));
  });

  it("records a gap the device cannot fill as unavailable, with the device's reason", async () => {
    const device = new ScriptedDevice('pool-pressure', 'pool.pressure', client);
    await device.start();
    device.forgotten = new Set([12, 13]);
    await device.produce(20, (seq) => seq >= 10 && seq < 15);
    await eventually(() => expect(gapsOf('pool-pressure')[0]?.state).toBe('unavailable'), 20_000);
    expect(gapsOf('pool-pressure')[0]).toMatchObject({
      from_seq: 10,
      to_seq: 14,
      detail: '2 of 5 gone: not-held 12-13',
    });
    expect(seqsOf('pool-pressure')).toEqual(range(20).filter((s) => s !== 12 && s !== 13));
  });

  it('gives a silent device a bounded number of requests, then marks the gap unanswered', async () => {
    const device = new ScriptedDevice('release-gauge', 'outflow', client, 'm3/s');
    await device.start();
    device.silent = true;
    await device.produce(8, (seq) => seq === 3);
    await eventually(() => expect(gapsOf('release-gauge')[0]?.state).toBe('unanswered'), 20_000);
    expect(device.requests).toHaveLength(2);
    expect(gapsOf('release-gauge')[0]).toMatchObject({
      attempts: 2,
      detail: '1 of 1 still missing',
    });
  });
});
