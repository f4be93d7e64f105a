import Database from 'better-sqlite3';
import request from 'supertest';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import type { ForecastUpdate } from '@stillwell/shared/forecasts';
import { signInAs, stepUp, type SignedInUser } from './support/auth';
import {
  publishRisingFlood,
  RES,
  startForecastPlant,
  type ForecastPlant,
} from './support/forecast-plant';

const csvOf = (rows: { elevation: number; area: number; storage: number }[]) =>
  ['elevation,area,storage', ...rows.map((r) => `${r.elevation},${r.area},${r.storage}`)].join(
    '\n',
  );

describe('reservoir definition upload: new versions, logbook, forecasts that record the version', () => {
  let plant: ForecastPlant;
  let admin: SignedInUser;
  const asAdmin = (method: 'get' | 'post', path: string) =>
    request(plant.gateway.url)[method](path).set('Authorization', `Bearer ${admin.token}`);
  const logbookKinds = () => {
    const db = new Database(plant.gateway.databasePath, { readonly: true });
    try {
      return db
        .prepare(
          "SELECT actor_name, payload FROM logbook_entries WHERE kind = 'reservoir.definition-changed'",
        )
        .all() as { actor_name: string; payload: string }[];
    } finally {
      db.close();
    }
  };

  beforeAll(async () => {
    plant = await startForecastPlant();
    await publishRisingFlood(plant);
    admin = await signInAs(plant.gateway, 'admin');
  });

  afterAll(async () => {
    await plant?.close();
  });

  it('needs reservoir.edit and a fresh step-up', async () => {
    const csv = csvOf(DEMO_RESERVOIR.storageTable);
    await plant.api
      .post(`/api/reservoirs/${RES}/definition/storage-table`)
      .send({ csv })
      .expect(403);
    const res = await asAdmin('post', `/api/reservoirs/${RES}/definition/storage-table`)
      .send({ csv })
      .expect(403);
    expect(res.body.code).toBe('step-up-required');
    await stepUp(plant.gateway, admin);
  });

  it('refuses a bad storage table naming the row and the column, and writes nothing', async () => {
    const rows = DEMO_RESERVOIR.storageTable.map((r) => ({ ...r }));
    rows[3]!.elevation = rows[2]!.elevation;
    const res = await asAdmin('post', `/api/reservoirs/${RES}/definition/storage-table`)
      .send({ csv: csvOf(rows) })
      .expect(400);
    expect(res.body.message).toContain(
      'storageTable row 4 (elevation): must be above row 3 (175 m)',
    );
    expect(res.body.problems[0]).toMatchObject({ row: 4, line: 5, column: 'elevation' });
    const unreadable = await asAdmin('post', `/api/reservoirs/${RES}/definition/storage-table`)
      .send({ csv: 'elevation,area,storage\n171,0,0\n173,twelve,8000' })
      .expect(400);
    expect(unreadable.body.message).toEqual([
      'storageTable row 2 (area): not a number ("twelve", line 3)',
    ]);
    const versions = await asAdmin('get', `/api/reservoirs/${RES}/versions`).expect(200);
    expect(versions.body).toHaveLength(1);
  });

  it('refuses structures that break the schema or the channels, naming the path', async () => {
    const gated = structuredClone(DEMO_RESERVOIR.structures);
    const spill = gated[0]!;
    if (spill.kind !== 'gated-spillway') throw new Error('fixture');
    (spill.gates[1] as { width: number }).width = -12;
    const bad = await asAdmin('post', `/api/reservoirs/${RES}/definition/structures`)
      .send({ structures: gated })
      .expect(400);
    expect(bad.body.message[0]).toMatch(/^structures\[0\]\.gates\[1\]\.width: /);
    const unknownChannel = structuredClone(DEMO_RESERVOIR.structures);
    const s2 = unknownChannel[0]!;
    if (s2.kind !== 'gated-spillway') throw new Error('fixture');
    s2.gates[2]!.channel = 'gate.9.opening';
    const res = await asAdmin('post', `/api/reservoirs/${RES}/definition/structures`)
      .send({ structures: unknownChannel })
      .expect(400);
    expect(res.body.message).toEqual([
      'structures[0].gates[2].channel: no channel "gate.9.opening" in the definition (a gate-opening channel must report it)',
    ]);
  });

  it('an accepted upload is a new version, logged, and the next forecast records it', async () => {
    await plant.scheduler.tick();
    const first = (await plant.api.get(`/api/reservoirs/${RES}/forecasts/latest`).expect(200))
      .body as ForecastUpdate;
    expect(first.run?.definitionVersion).toBe(1);

    // a resurvey: 2 % more storage above 200 m
    const resurveyed = DEMO_RESERVOIR.storageTable.map((r) =>
      r.elevation > 200
        ? { ...r, storage: Math.round(r.storage * 1.02), area: Math.round(r.area * 1.02) }
        : r,
    );
    const up = await asAdmin('post', `/api/reservoirs/${RES}/definition/storage-table`)
      .send({ csv: csvOf(resurveyed), note: 'resurvey 2026' })
      .expect(201);
    expect(up.body).toMatchObject({ version: 2, previousVersion: 1, change: 'storage-table' });

    const thresholds = [
      ...DEMO_RESERVOIR.thresholds,
      { id: 'low', label: 'Low level', kind: 'alert', elevation: 190 },
    ];
    const up3 = await asAdmin('post', `/api/reservoirs/${RES}/definition/structures`)
      .send({ thresholds, note: 'a low-level alert' })
      .expect(201);
    expect(up3.body).toMatchObject({ version: 3, previousVersion: 2, change: 'structures' });

    const def = await plant.api.get(`/api/reservoirs/${RES}`).expect(200);
    expect(def.body.version).toBe(3);
    expect(def.body.definition.storageTable).toEqual(resurveyed);
    expect(def.body.definition.thresholds).toHaveLength(thresholds.length);
    const versions = await asAdmin('get', `/api/reservoirs/${RES}/versions`).expect(200);
    expect(
      versions.body.map((v: { version: number; change: string; current: boolean }) => [
        v.version,
        v.change,
        v.current,
      ]),
    ).toEqual([
      [3, 'structures', true],
      [2, 'storage-table', false],
      [1, 'seed', false],
    ]);
    // the old version is still there as it was
    const v1 = await asAdmin('get', `/api/reservoirs/${RES}/versions/1`).expect(200);
    expect(v1.body.definition.storageTable).toEqual(DEMO_RESERVOIR.storageTable);

    const logged = logbookKinds();
    expect(logged.map((e) => e.actor_name)).toEqual([admin.username, admin.username]);
    expect(JSON.parse(logged[0]!.payload)).toMatchObject({
      reservoirId: RES,
      version: 2,
      previousVersion: 1,
      change: 'storage-table',
      note: 'resurvey 2026',
      storageRows: resurveyed.length,
    });

    // the change itself asks for a run; the debounced handler makes it
    expect(plant.scheduler.pendingFor(RES)?.trigger).toBe('definition');
    await plant.scheduler.flushPending(RES);
    const after = (await plant.api.get(`/api/reservoirs/${RES}/forecasts/latest`).expect(200))
      .body as ForecastUpdate;
    expect(after.run?.trigger).toBe('definition');
    expect(after.run?.definitionVersion).toBe(3);
    expect(after.run?.thresholds.map((t) => t.id)).toContain('low');
  });
});
