import { connectAsync, type MqttClient } from 'mqtt';
import request from 'supertest';
import {
  alarmHistorySchema,
  alarmListSchema,
  alarmPerformanceSchema,
  damSafetySchema,
  type AlarmList,
} from '@stillwell/shared/alarms';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { telemetryTopic } from '@stillwell/shared/telemetry';
import { AlarmsService } from '../src/alarms/alarms.service';
import { SiteClockService } from '../src/clock/site-clock.service';
import { ForecastsService } from '../src/forecasts/forecasts.service';
import { OrderEvents } from '../src/orders/order-events';
import { IngestionService } from '../src/telemetry/ingestion.service';
import { ACCESS_TEST_ENV, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = DEMO_RESERVOIR.id;
const BASE = `/api/reservoirs/${RES}/alarms`;

/**
 * The alarm path through the real gateway: readings over MQTT, the site clock moved by the test
 * (no waiting on the wall clock), alarms recorded, handled by people with their roles, logged.
 */
describe('alarms: MQTT -> engine -> store -> API -> logbook', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let device: MqttClient;
  let operator: SignedInUser;
  let engineer: SignedInUser;
  let seq = 0;

  const clock = () => gateway.app.get(SiteClockService);
  const siteNow = () => clock().now(RES);
  const setSiteClock = (ms: number) =>
    clock().accept(
      `stillwell/v1/${RES}/clock`,
      Buffer.from(JSON.stringify({ siteTime: new Date(ms).toISOString(), speed: 1 })),
    );
  const as = (user: SignedInUser) => ({ Authorization: `Bearer ${user.token}` });
  const list = async (): Promise<AlarmList> =>
    alarmListSchema.parse(
      (await request(gateway.url).get(BASE).set(as(operator)).expect(200)).body,
    );
  const find = async (id: string) => (await list()).alarms.find((a) => a.conditionId === id);

  /** Both pool gauges report `value` every 30 s of site time over [from, to]; resolves once stored. */
  async function reportPool(from: number, to: number, value: number) {
    const ingestion = gateway.app.get(IngestionService);
    const stored = ingestion.counters.stored;
    let sent = 0;
    for (let t = from; t <= to; t += 30_000) {
      for (const [deviceId, channel] of [
        ['pool-radar', 'pool.radar'],
        ['pool-pressure', 'pool.pressure'],
      ] as const) {
        const message = {
          deviceId,
          channel,
          seq: seq++,
          time: new Date(t).toISOString(),
          value,
          unit: 'm',
          quality: 'good',
        };
        await device.publishAsync(telemetryTopic(RES, deviceId), JSON.stringify(message), {
          qos: 1,
        });
        sent += 1;
      }
    }
    await eventually(() => expect(ingestion.counters.stored).toBeGreaterThanOrEqual(stored + sent));
  }

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    await eventually(async () => {
      const res = await request(gateway.url).get('/api/health');
      expect(res.body.info?.broker?.status).toBe('up');
    });
    device = await connectAsync(broker.url, {
      clientId: `test-alarm-device-${Date.now()}`,
      protocolVersion: 4,
    });
    operator = await signInAs(gateway, 'operator');
    engineer = await signInAs(gateway, 'engineer');
  });

  afterAll(async () => {
    await device?.endAsync();
    await gateway?.close();
    await broker?.stop();
  });

  it('raises the pool alarm after its on-delay in site time, and lists it unacknowledged', async () => {
    const t0 = Math.floor(siteNow() / 1000) * 1000 + 60_000;
    setSiteClock(t0);
    await reportPool(t0 - 60_000, t0, 205.8);
    // above the watch level at t0, but not yet for the 120 s on-delay: nothing
    await eventually(async () => expect(clock().now(RES)).toBeGreaterThanOrEqual(t0));
    await gateway.app.get(AlarmsService).tick();
    expect(await find('pool-high.watch')).toBeUndefined();
    setSiteClock(t0 + 5 * 60_000);
    await reportPool(t0 + 30_000, t0 + 5 * 60_000, 205.8);
    await eventually(async () => {
      const a = await find('pool-high.watch');
      expect(a).toMatchObject({ state: 'unacknowledged', priority: 'advisory', active: true });
    });
    const all = await list();
    expect(all.counts.byPriority.advisory.unacknowledged).toBeGreaterThanOrEqual(1);
  });

  it('acknowledges with a comment into the logbook, and refuses acknowledging twice', async () => {
    const res = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/acknowledge`)
      .set(as(operator))
      .send({ comment: 'watching the inflow' })
      .expect(200);
    expect(res.body).toMatchObject({ state: 'acknowledged', acknowledgedBy: 'operator' });
    const again = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/acknowledge`)
      .set(as(operator))
      .send({});
    expect([again.status, again.body.code]).toEqual([409, 'already-acknowledged']);
    const log = await request(gateway.url)
      .get('/api/logbook')
      .query({ kind: 'alarm.' })
      .set(as(operator))
      .expect(200);
    const entry = (
      log.body.rows as Array<{ kind: string; actorName: string; payload: Record<string, unknown> }>
    ).find((e) => e.kind === 'alarm.acknowledged');
    expect(entry).toMatchObject({
      actorName: 'operator',
      payload: {
        conditionId: 'pool-high.watch',
        comment: 'watching the inflow',
        from: 'unacknowledged',
        to: 'acknowledged',
      },
    });
  });

  it('lets only the engineer shelve, never without a reason, and expires the shelf in site time', async () => {
    const byOperator = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/shelve`)
      .set(as(operator))
      .send({ reason: 'known', durationS: 600 });
    expect([byOperator.status, byOperator.body.code]).toEqual([403, 'forbidden']);
    const noReason = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/shelve`)
      .set(as(engineer))
      .send({ reason: ' ', durationS: 600 });
    expect([noReason.status, noReason.body.code]).toEqual([400, 'reason-required']);
    const tooLong = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/shelve`)
      .set(as(engineer))
      .send({ reason: 'gauge survey today', durationS: 13 * 3600 });
    expect([tooLong.status, tooLong.body.code]).toEqual([400, 'expiry-too-far']);
    const shelved = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/shelve`)
      .set(as(engineer))
      .send({ reason: 'gauge survey today', durationS: 600 })
      .expect(200);
    expect(shelved.body).toMatchObject({
      state: 'shelved',
      reason: 'gauge survey today',
      handledBy: 'engineer',
    });
    expect((await list()).counts.shelved).toBe(1);
    // the shelf runs out ten minutes later in site time; still active, so it comes back unacknowledged
    setSiteClock(siteNow() + 11 * 60_000);
    await reportPool(siteNow() - 60_000, siteNow(), 205.8);
    await gateway.app.get(AlarmsService).tick();
    await eventually(async () =>
      expect((await find('pool-high.watch'))?.state).toBe('unacknowledged'),
    );
    const history = alarmHistorySchema.parse(
      (
        await request(gateway.url)
          .get(`${BASE}/pool-high.watch/history`)
          .set(as(operator))
          .expect(200)
      ).body,
    );
    expect(history.events.map((e) => e.kind).reverse()).toEqual([
      'raised',
      'acknowledged',
      'shelved',
      'shelf-expired',
    ]);
    expect(history.events.find((e) => e.kind === 'shelved')?.logbookSeq).toEqual(
      expect.any(Number),
    );
  });

  it('takes out of service with a reason and returns to service; refuses returning one in service', async () => {
    await request(gateway.url)
      .post(`${BASE}/pool-high.watch/out-of-service`)
      .set(as(engineer))
      .send({ reason: 'radar replaced' })
      .expect(200);
    expect((await find('pool-high.watch'))?.state).toBe('out-of-service');
    await request(gateway.url)
      .post(`${BASE}/pool-high.watch/return-to-service`)
      .set(as(engineer))
      .send({})
      .expect(200);
    const twice = await request(gateway.url)
      .post(`${BASE}/pool-high.watch/return-to-service`)
      .set(as(engineer))
      .send({});
    expect([twice.status, twice.body.code]).toEqual([409, 'already-in-service']);
    const unknown = await request(gateway.url)
      .post(`${BASE}/no-such/acknowledge`)
      .set(as(operator))
      .send({});
    expect(unknown.status).toBe(404);
  });

  it('takes external conditions through raise/clear (gate not following its command)', async () => {
    const alarms = gateway.app.get(AlarmsService);
    await expect(
      alarms.raise(RES, 'gate-not-following.gate-2', {
        message: 'gate 2 at 1.2 m, commanded 4.5 m',
        value: 1.2,
        limit: 4.5,
      }),
    ).resolves.toBe(true);
    await expect(
      alarms.raise(RES, 'gate-not-following.gate-2', { message: 'still' }),
    ).resolves.toBe(false);
    const listed = await list();
    // immediate outranks advisory, and both are unacknowledged: the gate comes first
    expect(listed.alarms[0]).toMatchObject({
      conditionId: 'gate-not-following.gate-2',
      priority: 'immediate',
      source: 'external',
    });
    await expect(
      alarms.clear(RES, 'gate-not-following.gate-2', { message: 'at 4.5 m' }),
    ).resolves.toBe(true);
    await expect(alarms.raise(RES, 'pool-high.watch', { message: 'no' })).rejects.toThrow(
      /not an external/,
    );
  });

  it('turns an order fault of the gate-orders module into an alarm, cleared when the order is no longer faulted', async () => {
    const events = gateway.app.get(OrderEvents);
    const alarm = {
      kind: 'order.not-following',
      reservoirId: RES,
      orderId: 41,
      detail: 'Gate 2 has not moved towards 4.5 m',
      at: new Date().toISOString(),
    };
    events.emit({ kind: 'alarm', reservoirId: RES, alarm } as never);
    await eventually(async () =>
      expect(await find('order-not-following')).toMatchObject({
        active: true,
        priority: 'immediate',
      }),
    );
    expect((await find('order-not-following'))?.message).toMatch(/order 41: Gate 2/);
    events.emit({
      kind: 'order',
      reservoirId: RES,
      order: { id: 41, state: 'withdrawn' },
    } as never);
    await eventually(async () => expect((await find('order-not-following'))?.active).toBe(false));
  });

  it('raises a burst of out-of-range messages for a channel from the quarantine', async () => {
    const now = siteNow();
    for (const k of [0, 1, 2]) {
      const message = {
        deviceId: 'tailwater-gauge',
        channel: 'tailwater',
        seq: 1000 + k,
        time: new Date(now - k * 60_000).toISOString(),
        value: 250,
        unit: 'm',
        quality: 'good',
      };
      await device.publishAsync(telemetryTopic(RES, 'tailwater-gauge'), JSON.stringify(message), {
        qos: 1,
      });
    }
    await eventually(async () => {
      await gateway.app.get(AlarmsService).tick();
      expect(await find('out-of-range.tailwater')).toMatchObject({
        state: 'unacknowledged',
        active: true,
      });
    });
  });

  it('follows the live forecast: a crossing within the horizon and too little time left to act', async () => {
    const at = siteNow();
    const run = {
      computedAtMs: at,
      peak: { elevation: 211.2 },
      thresholds: DEMO_RESERVOIR.thresholds.map((t) => ({
        id: t.id,
        elevation: t.elevation,
        timeMs: t.elevation <= 211.2 ? at + 6 * 3_600_000 : null,
        alreadyAbove: false,
      })),
      timeLeft: { status: 'ok', timeLeftS: 5400 },
    };
    // the forecast module announces each stored run on updates$ (a ForecastRun; the alarms read a part)
    gateway.app
      .get(ForecastsService)
      .updates$.next({ reservoirId: RES, run, problem: null, caution: '' } as never);
    await eventually(async () => {
      expect((await find('forecast-crossing.freeboard-limit'))?.active).toBe(true);
      expect(await find('time-left')).toMatchObject({ priority: 'immediate', active: true });
    });
  });

  it('reports alarm rates and the dam-safety record through the API', async () => {
    const perf = alarmPerformanceSchema.parse(
      (await request(gateway.url).get(`${BASE}/performance`).set(as(operator)).expect(200)).body,
    );
    expect(perf.total).toBeGreaterThanOrEqual(2);
    expect(perf.mostFrequent.map((m) => m.conditionId)).toContain('pool-high.watch');
    const conditions = await request(gateway.url)
      .get(`${BASE}/conditions`)
      .set(as(operator))
      .expect(200);
    expect(conditions.body.conditions.length).toBeGreaterThan(40);
    const dam = damSafetySchema.parse(
      (
        await request(gateway.url)
          .get(`/api/reservoirs/${RES}/dam-safety`)
          .set(as(operator))
          .expect(200)
      ).body,
    );
    expect(dam.weirs.map((w) => w.weir.id)).toEqual(['weir-left', 'weir-right']);
    expect(dam.pool.t.length).toBeGreaterThan(0);
  });

  it('changes a weir limit as a new definition version, for limits.edit with step-up only', async () => {
    const LIMITS = `/api/reservoirs/${RES}/definition/limits`;
    const { version } = (
      await request(gateway.url).get(`/api/reservoirs/${RES}`).set(as(operator)).expect(200)
    ).body as { version: number };
    const change = {
      baseVersion: version,
      note: 'limit raised after the 2029 survey',
      seepageWeirs: [{ id: 'weir-left', maxFlow: 0.02 }],
    };
    // the administrator edits the definition but not its limits (the permission matrix)
    const admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    const denied = await request(gateway.url).post(LIMITS).set(as(admin)).send(change);
    expect([denied.status, denied.body.code]).toEqual([403, 'forbidden']);
    const unstepped = await request(gateway.url).post(LIMITS).set(as(engineer)).send(change);
    expect(unstepped.body.code).toBe('step-up-required');
    await stepUp(gateway, engineer);
    const bad = await request(gateway.url)
      .post(LIMITS)
      .set(as(engineer))
      .send({ ...change, seepageWeirs: [{ id: 'weir-left', maxFlow: -1 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.message.join('\n')).toMatch(/^seepageWeirs\[0\]\.maxFlow: /m);
    const ok = await request(gateway.url).post(LIMITS).set(as(engineer)).send(change).expect(201);
    expect(ok.body.changes).toEqual([
      {
        field: 'seepageWeirs.weir-left.maxFlow',
        from: DEMO_RESERVOIR.seepageWeirs!.find((w) => w.id === 'weir-left')!.maxFlow,
        to: 0.02,
      },
    ]);
    await gateway.app.get(AlarmsService).tick();
    const conditions = await request(gateway.url)
      .get(`${BASE}/conditions`)
      .set(as(operator))
      .expect(200);
    expect(conditions.body.definitionVersion).toBe(ok.body.version);
    expect(
      conditions.body.conditions.find((c: { id: string }) => c.id === 'seepage-high.weir-left')
        .limit,
    ).toBe(0.02);
  });
});
