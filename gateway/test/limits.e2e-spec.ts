import Database from 'better-sqlite3';
import request from 'supertest';
import { alarmListSchema, weirFlow } from '@stillwell/shared/alarms';
import {
  DEMO_RESERVOIR,
  limitsChangeResultSchema,
  type ReservoirDefinition,
} from '@stillwell/shared/reservoirs';
import { telemetryTopic } from '@stillwell/shared/telemetry';
import { AlarmsService } from '../src/alarms/alarms.service';
import { StatusService } from '../src/telemetry/status.service';
import { ACCESS_TEST_ENV, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { TestField } from './support/field';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = DEMO_RESERVOIR.id;
const LIMITS = `/api/reservoirs/${RES}/definition/limits`;
const WEIR = DEMO_RESERVOIR.seepageWeirs!.find((w) => w.id === 'weir-left')!;
/** A head over the left weir's notch, m: its flow lies between the old limit and the new one. */
const HEAD = 0.15;
const NEW_MAX_FLOW = 0.01;

/**
 * Changing limits through the real gateway: the engineer's change is a new definition version
 * with its logbook entry, refused whole (nothing stored) when anything is wrong, and the alarm
 * engine judges the next real readings over the broker by the new limits.
 */
describe('limits change: POST definition/limits -> new version, logbook, alarms', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let field: TestField;
  let operator: SignedInUser;
  let engineer: SignedInUser;
  let seq = 0;
  let lastT = 0;

  const as = (user: SignedInUser) => ({ Authorization: `Bearer ${user.token}` });
  const current = async () =>
    (await request(gateway.url).get(`/api/reservoirs/${RES}`).set(as(operator)).expect(200))
      .body as { version: number; definition: ReservoirDefinition };
  const leftWeirAlarm = async () => {
    const res = await request(gateway.url)
      .get(`/api/reservoirs/${RES}/alarms`)
      .set(as(operator))
      .expect(200);
    return alarmListSchema
      .parse(res.body)
      .alarms.find((a) => a.conditionId === 'seepage-high.weir-left');
  };
  /** What is stored, straight from the SQLite file: versions and definition-change entries. */
  const stored = () => {
    const db = new Database(gateway.databasePath, { readonly: true });
    try {
      const count = (sql: string) => (db.prepare(sql).get() as { n: number }).n;
      return {
        versions: count('SELECT COUNT(*) AS n FROM reservoir_versions'),
        entries: count(
          "SELECT COUNT(*) AS n FROM logbook_entries WHERE kind = 'reservoir.definition-changed'",
        ),
      };
    } finally {
      db.close();
    }
  };
  /** The left weir's logger reports its head now (site time); resolves once it is stored. */
  async function reportWeir(head: number) {
    const t = Math.max(field.siteNow, lastT + 1);
    lastT = t;
    const message = {
      deviceId: 'seepage-left',
      channel: WEIR.channel,
      seq: seq++,
      time: new Date(t).toISOString(),
      value: head,
      unit: 'm',
      quality: 'good',
    };
    await field.client.publishAsync(telemetryTopic(RES, 'seepage-left'), JSON.stringify(message), {
      qos: 1,
    });
    await eventually(() => {
      const c = gateway.app
        .get(StatusService)
        .status(RES)
        .channels.find((x) => x.channel === WEIR.channel);
      if (c?.t !== t) throw new Error(`${WEIR.channel} not stored yet`);
    });
  }

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    field = await TestField.start(gateway, broker.url);
    operator = await signInAs(gateway, 'operator');
    engineer = await signInAs(gateway, 'engineer');
  });

  afterAll(async () => {
    await field?.stop();
    await gateway?.close();
    await broker?.stop();
  });

  it('has a premise: the weir flow at the test head lies between the old and the new limit', () => {
    const flow = weirFlow(WEIR, HEAD);
    expect(flow).toBeLessThan(WEIR.maxFlow * (1 - 0.1));
    expect(flow).toBeGreaterThan(NEW_MAX_FLOW);
  });

  it('refuses the operator, the engineer without step-up, and a bad body naming its field; stores nothing', async () => {
    await field.report();
    await reportWeir(HEAD);
    await gateway.app.get(AlarmsService).tick();
    expect((await leftWeirAlarm())?.active ?? false).toBe(false);

    const before = stored();
    const { version } = await current();
    const change = {
      baseVersion: version,
      note: 'tighter limit while the left drain is surveyed',
      seepageWeirs: [{ id: 'weir-left', maxFlow: NEW_MAX_FLOW }],
    };
    const byOperator = await request(gateway.url).post(LIMITS).set(as(operator)).send(change);
    expect([byOperator.status, byOperator.body.code]).toEqual([403, 'forbidden']);
    const unstepped = await request(gateway.url).post(LIMITS).set(as(engineer)).send(change);
    expect([unstepped.status, unstepped.body.code]).toEqual([403, 'step-up-required']);

    await stepUp(gateway, engineer);
    const negative = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({ ...change, seepageWeirs: [{ id: 'weir-left', maxFlow: -1 }] });
    expect(negative.status).toBe(400);
    expect(negative.body.problems).toEqual([
      expect.objectContaining({ field: 'seepageWeirs[0].maxFlow' }),
    ]);
    expect(negative.body.message[0]).toMatch(/^seepageWeirs\[0\]\.maxFlow: /);
    const noNote = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({ ...change, note: undefined });
    expect([noNote.status, noNote.body.problems?.[0]?.field]).toEqual([400, 'note']);
    const unknownWeir = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({ ...change, seepageWeirs: [{ id: 'weir-middle', maxFlow: NEW_MAX_FLOW }] });
    expect([unknownWeir.status, unknownWeir.body.problems?.[0]?.field]).toEqual([
      400,
      'seepageWeirs[0].id',
    ]);

    expect(stored()).toEqual(before);
    expect((await current()).version).toBe(version);
  });

  it('writes a new version with a logbook entry from/to, and the alarm engine judges by it', async () => {
    const before = stored();
    const { version, definition } = await current();
    const res = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({
        baseVersion: version,
        note: 'tighter limit while the left drain is surveyed',
        seepageWeirs: [{ id: 'weir-left', maxFlow: NEW_MAX_FLOW }],
        // raised at once rather than after the usual on-delay, while the survey lasts
        alarms: { seepage: { onDelayS: 0, deadbandFraction: 0.1 } },
      })
      .expect(201);
    const result = limitsChangeResultSchema.parse(res.body);
    const onDelayBefore = definition.alarms?.seepage?.onDelayS;
    expect(result).toEqual({
      reservoirId: RES,
      version: version + 1,
      previousVersion: version,
      change: 'limits',
      changes: [
        { field: 'seepageWeirs.weir-left.maxFlow', from: WEIR.maxFlow, to: NEW_MAX_FLOW },
        { field: 'alarms.seepage.onDelayS', from: onDelayBefore ?? null, to: 0 },
      ],
    });
    expect(stored()).toEqual({ versions: before.versions + 1, entries: before.entries + 1 });

    const after = await current();
    expect(after.version).toBe(version + 1);
    expect(after.definition.seepageWeirs?.find((w) => w.id === 'weir-left')?.maxFlow).toBe(
      NEW_MAX_FLOW,
    );
    expect(after.definition.alarms?.seepage?.onDelayS).toBe(0);
    // the rest of the definition stays as it was
    expect(after.definition.seepageWeirs?.find((w) => w.id === 'weir-right')).toEqual(
      definition.seepageWeirs?.find((w) => w.id === 'weir-right'),
    );

    const log = await request(gateway.url)
      .get('/api/logbook')
      .query({ kind: 'reservoir.definition-changed' })
      .set(as(operator))
      .expect(200);
    const entry = (
      log.body.rows as Array<{ actorName: string; payload: Record<string, unknown> }>
    ).find((e) => e.payload.version === version + 1);
    expect(entry).toMatchObject({
      actorName: 'engineer',
      payload: {
        reservoirId: RES,
        change: 'limits',
        previousVersion: version,
        note: 'tighter limit while the left drain is surveyed',
        changes: result.changes,
      },
    });
    const versions = await request(gateway.url)
      .get(`/api/reservoirs/${RES}/versions`)
      .set(as(operator))
      .expect(200);
    expect(versions.body[0]).toMatchObject({ version: version + 1, change: 'limits' });

    // the same head as before, now above the new limit: raised by the next real readings
    field.advanceSiteClock(60_000);
    await reportWeir(HEAD);
    await eventually(async () => {
      await gateway.app.get(AlarmsService).tick();
      expect(await leftWeirAlarm()).toMatchObject({
        active: true,
        state: 'unacknowledged',
        limit: NEW_MAX_FLOW,
      });
    });
    expect((await leftWeirAlarm())?.value).toBeCloseTo(weirFlow(WEIR, HEAD), 9);
  });

  it('refuses a change made on an older version with 409, storing nothing', async () => {
    const before = stored();
    const { version } = await current();
    const stale = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({
        baseVersion: version - 1,
        note: 'made on the version before the survey change',
        seepageWeirs: [{ id: 'weir-left', maxFlow: 0.03 }],
      });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/changed meanwhile/);
    expect(stored()).toEqual(before);
    expect((await current()).definition.seepageWeirs?.[0]?.maxFlow).toBe(NEW_MAX_FLOW);
  });
});
