import Database from 'better-sqlite3';
import request from 'supertest';
import { io, type Socket } from 'socket.io-client';
import {
  FORECAST_LIVE_EVENTS,
  type ForecastRun,
  type ForecastUpdate,
} from '@stillwell/shared/forecasts';
import { LIVE_NAMESPACE } from '@stillwell/shared/telemetry';
import { signInAs } from './support/auth';
import { eventually } from './support/gateway';
import {
  publishRisingFlood,
  RES,
  startForecastPlant,
  T0,
  type ForecastPlant,
} from './support/forecast-plant';

const base = `/api/reservoirs/${RES}/forecasts`;

describe('live forecast: scheduled and on material change, stored, pushed, served', () => {
  let plant: ForecastPlant;
  let socket: Socket;
  const pushed: ForecastUpdate[] = [];
  const latest = async (): Promise<ForecastRun> => {
    const res = await plant.api.get(`${base}/latest`).expect(200);
    return (res.body as ForecastUpdate).run!;
  };
  const storedRuns = () => {
    const db = new Database(plant.gateway.databasePath, { readonly: true });
    try {
      return db
        .prepare(
          'SELECT id, trigger, definition_version, code_version FROM forecast_runs ORDER BY id',
        )
        .all() as {
        id: number;
        trigger: string;
        definition_version: number;
        code_version: string;
      }[];
    } finally {
      db.close();
    }
  };

  beforeAll(async () => {
    plant = await startForecastPlant();
    await publishRisingFlood(plant);
    socket = io(`${plant.gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: plant.operator.token },
    });
    socket.on(FORECAST_LIVE_EVENTS.forecast, (u: ForecastUpdate) => pushed.push(u));
    const ack = await socket
      .timeout(5000)
      .emitWithAck(FORECAST_LIVE_EVENTS.subscribe, { reservoirId: RES });
    expect(ack).toEqual({ ok: true });
  });

  afterAll(async () => {
    socket?.close();
    await plant?.close();
  });

  it('the scheduled handler stores a run with its inputs, definition and code versions and outputs', async () => {
    const before = (await plant.api.get(`${base}/latest`).expect(200)).body as ForecastUpdate;
    expect(before.run).toBeNull();
    expect(before.caution).toMatch(/Decision support/);

    await plant.scheduler.tick();
    const run = await latest();
    expect(run.trigger).toBe('startup');
    expect(run.computedAtMs).toBeGreaterThanOrEqual(T0);
    expect(run.definitionVersion).toBe(1);
    expect(run.codeVersion.gateway).toBe('0.1.0');
    expect(run.codeVersion.options).toMatch(/^[0-9a-f]{16}$/);
    expect(run.inputs).toMatchObject({
      startElevation: 206,
      poolSource: 'pool.radar',
      openings: { 'gate-1': 0, 'gate-2': 0, 'gate-3': 0, 'low-level-outlet': 10 },
      assumedClosed: [],
      inflow: { method: 'linear-trend', nowFlow: 900, observedPoints: 181 },
      ensemble: { members: 40 },
    });
    // 24 h at 5-minute points, the band around the deterministic run
    expect(run.series.p50).toHaveLength(289);
    expect(run.series.p90.at(-1)!).toBeGreaterThan(run.series.p10.at(-1)!);
    expect(run.peak.elevation).toBeGreaterThan(206.5);
    expect(run.thresholds.map((t) => t.id)).toEqual(
      expect.arrayContaining(['watch', 'crest-main-spillway', 'freeboard-limit', 'dam-crest']),
    );
    expect(run.timeLeft.target).toBe(210.5);
    expect(['ok', 'past', 'impossible', 'not-needed']).toContain(run.timeLeft.status);
    expect(run.holdNow.gates).toEqual(['gate-1', 'gate-2', 'gate-3']);
    expect(storedRuns()).toEqual([
      {
        id: run.id,
        trigger: 'startup',
        definition_version: 1,
        code_version: JSON.stringify(run.codeVersion),
      },
    ]);

    // within the same site minute the handler does nothing; in the next one it runs again
    await plant.scheduler.tick();
    expect(storedRuns()).toHaveLength(1);
    plant.setSiteClock(T0 + 60_000);
    await plant.scheduler.tick();
    expect(storedRuns().map((r) => r.trigger)).toEqual(['startup', 'schedule']);
    expect((await plant.api.get(`${base}/${run.id}`).expect(200)).body).toEqual(run);
  });

  it('pushes every run to the sockets that follow the forecast', async () => {
    await eventually(() => expect(pushed.some((u) => u.run?.trigger === 'schedule')).toBe(true));
    // the latest run came at once on subscribing (none yet then), each run after it
    expect(pushed[0]).toMatchObject({ reservoirId: RES, run: null });
    expect(pushed.map((u) => u.run?.trigger ?? null)).toEqual([null, 'startup', 'schedule']);
  });

  it('a material change (a gate opening) sets off a debounced run, with a lower peak', async () => {
    const shut = await latest();
    await plant.publish('gate-controller', 'gate.1.opening', 'm', 3, T0 + 50_000);
    await eventually(() =>
      expect(plant.scheduler.pendingFor(RES)).toEqual({
        trigger: 'telemetry',
        detail: 'gate-1 moved from 0.00 m to 3.00 m',
      }),
    );
    await plant.scheduler.flushPending(RES);
    const open = await latest();
    expect(open.trigger).toBe('telemetry');
    expect(open.inputs.openings['gate-1']).toBe(3);
    expect(open.peak.elevation).toBeLessThan(shut.peak.elevation);
    expect(plant.scheduler.pendingFor(RES)).toBeUndefined();
  });

  it('lists the runs in a range of site time as summaries, oldest first', async () => {
    const res = await plant.api
      .get(base)
      .query({
        from: new Date(T0 - 1000).toISOString(),
        to: new Date(T0 + 3_600_000).toISOString(),
      })
      .expect(200);
    expect(res.body.runs.map((r: { trigger: string }) => r.trigger)).toEqual([
      'startup',
      'schedule',
      'telemetry',
    ]);
    expect(res.body.runs[0]).toEqual(
      expect.objectContaining({
        definitionVersion: 1,
        startElevation: 206,
        timeLeftStatus: expect.any(String),
      }),
    );
    await plant.api.get(base).query({ from: 'yesterday' }).expect(400);
    await plant.api.get(`${base}/999999`).expect(404);
  });

  it('keeps forecasts from roles the matrix does not give them to', async () => {
    const admin = await signInAs(plant.gateway, 'admin');
    await request(plant.gateway.url)
      .get(`${base}/latest`)
      .set('Authorization', `Bearer ${admin.token}`)
      .expect(403);
    const adminSocket = io(`${plant.gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: admin.token },
    });
    try {
      const ack = await adminSocket
        .timeout(5000)
        .emitWithAck(FORECAST_LIVE_EVENTS.subscribe, { reservoirId: RES });
      expect(ack).toEqual({ ok: false, error: 'forbidden' });
    } finally {
      adminSocket.close();
    }
    const liaison = await signInAs(plant.gateway, 'liaison');
    await request(plant.gateway.url)
      .post(`${base}/what-if`)
      .set('Authorization', `Bearer ${liaison.token}`)
      .send({ inflow: [{ t: 0, q: 100 }], schedule: [] })
      .expect(403);
  });

  it('stored runs cannot be changed or removed', () => {
    const db = new Database(plant.gateway.databasePath);
    try {
      expect(() => db.prepare('UPDATE forecast_runs SET peak_elevation = 0').run()).toThrow(
        /append-only/,
      );
      expect(() => db.prepare('DELETE FROM forecast_runs').run()).toThrow(/append-only/);
    } finally {
      db.close();
    }
  });
});
