import request from 'supertest';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import { LogbookService } from '../src/logbook/logbook.service';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

const T0 = Date.parse('2026-12-01T22:00:00.000Z');
const MIN = 60_000;
// only Date is faked: the gateway's own timers, sockets and the database run for real
const ONLY_DATE: Parameters<typeof jest.useFakeTimers>[0] = {
  doNotFake: [
    'hrtime',
    'nextTick',
    'performance',
    'queueMicrotask',
    'setImmediate',
    'clearImmediate',
    'setInterval',
    'clearInterval',
    'setTimeout',
    'clearTimeout',
  ],
};

/** The grid's server side: paging, sorting and each filter, against entries at known times. */
describe('logbook: server-side paging, sorting and filtering', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let reviewer: SignedInUser;
  const ours: Array<{ seq: number; time: string }> = [];
  const get = async (query: string) =>
    (
      await request(gateway.url)
        .get(`/api/logbook?${query}`)
        .set('Authorization', `Bearer ${reviewer.token}`)
        .expect(200)
    ).body as { rows: LogbookEntry[]; total: number };
  const seqs = (rows: LogbookEntry[]) => rows.map((e) => e.seq);

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      ORDER_TICK_MS: '0',
      FORECAST_TICK_MS: '0',
    });
    reviewer = await signInAs(gateway, 'reviewer');
    const logbook = gateway.app.get(LogbookService);
    const who = (username: string, role: string) => ({ userId: username, username, roles: [role] });
    const night = [
      { kind: 'shift.note', actor: who('mara.ostby', 'operator'), controls: ['gate-1'] },
      { kind: 'order.drafted', actor: who('mara.ostby', 'operator'), controls: ['gate-2'] },
      { kind: 'order.authorised', actor: who('tamsin.oake', 'engineer'), controls: ['gate-2'] },
      { kind: 'shift.handover', actor: who('mara.ostby', 'operator'), controls: [] },
      { kind: 'order.executed', actor: who('jory.penhale', 'operator'), controls: ['gate-2'] },
    ];
    jest.useFakeTimers(ONLY_DATE);
    try {
      for (const [i, e] of night.entries()) {
        jest.setSystemTime(T0 + i * 10 * MIN);
        const { seq } = await logbook.append({
          kind: e.kind,
          actor: e.actor,
          payload: { controls: e.controls, n: i },
        });
        ours.push({ seq, time: new Date(T0 + i * 10 * MIN).toISOString() });
      }
    } finally {
      jest.useRealTimers();
    }
  });
  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it('pages newest first by default, with the total of the filter', async () => {
    const all = await get('from=2026-12-01T21:59:00Z&to=2026-12-01T23:00:00Z&pageSize=2');
    expect(all.total).toBe(5);
    expect(seqs(all.rows)).toEqual([ours[4]!.seq, ours[3]!.seq]);
    const second = await get('from=2026-12-01T21:59:00Z&to=2026-12-01T23:00:00Z&pageSize=2&page=1');
    expect(seqs(second.rows)).toEqual([ours[2]!.seq, ours[1]!.seq]);
    const last = await get('from=2026-12-01T21:59:00Z&to=2026-12-01T23:00:00Z&pageSize=2&page=2');
    expect(seqs(last.rows)).toEqual([ours[0]!.seq]);
  });

  it('filters by a time range, inclusive at both ends', async () => {
    const range = await get(`from=${ours[1]!.time}&to=${ours[3]!.time}`);
    expect(seqs(range.rows)).toEqual([ours[3]!.seq, ours[2]!.seq, ours[1]!.seq]);
  });

  it('filters by actor, by kind or kind prefix, and by gate', async () => {
    expect(seqs((await get('actor=tamsin.oake')).rows)).toEqual([ours[2]!.seq]);
    expect(seqs((await get('kind=order.executed')).rows)).toEqual([ours[4]!.seq]);
    expect(seqs((await get(`kind=order.&from=${ours[0]!.time}`)).rows)).toEqual([
      ours[4]!.seq,
      ours[2]!.seq,
      ours[1]!.seq,
    ]);
    expect(seqs((await get('gate=gate-2&actor=mara.ostby')).rows)).toEqual([ours[1]!.seq]);
  });

  it('sorts by kind or actor either way, on the server', async () => {
    const window = `from=${ours[0]!.time}&to=${ours[4]!.time}`;
    const byKind = await get(`${window}&sort=kind&order=asc`);
    expect(byKind.rows.map((e) => e.kind)).toEqual([
      'order.authorised',
      'order.drafted',
      'order.executed',
      'shift.handover',
      'shift.note',
    ]);
    const byActor = await get(`${window}&sort=actorName&order=desc&pageSize=1`);
    expect(byActor.total).toBe(5);
    expect(byActor.rows.map((e) => e.actorName)).toEqual(['tamsin.oake']);
  });

  it('refuses a page size past the grid limit and an unknown sort field, naming them', async () => {
    const bad = await request(gateway.url)
      .get('/api/logbook?pageSize=500&sort=hash')
      .set('Authorization', `Bearer ${reviewer.token}`)
      .expect(400);
    const text = JSON.stringify(bad.body.message);
    expect(text).toMatch(/pageSize/);
    expect(text).toMatch(/sort/);
  });
});
