import request from 'supertest';
import { io, type Socket } from 'socket.io-client';
import { ALARM_LIVE_EVENTS, alarmListSchema, type AlarmList } from '@stillwell/shared/alarms';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { LIVE_NAMESPACE } from '@stillwell/shared/telemetry';
import { AlarmsService } from '../src/alarms/alarms.service';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { TestField } from './support/field';
import { eventually, startTestGateway, type TestGateway } from './support/gateway';

const RES = DEMO_RESERVOIR.id;
const WATCH = DEMO_RESERVOIR.thresholds.find((t) => t.id === 'watch')!;

/** A console's socket on /live that keeps every alarm list pushed to it, checked against the schema. */
class ListeningConsole {
  readonly lists: AlarmList[] = [];
  constructor(readonly socket: Socket) {
    socket.on(ALARM_LIVE_EVENTS.list, (body: unknown) =>
      this.lists.push(alarmListSchema.parse(body)),
    );
  }
  subscribe(reservoirId = RES): Promise<{ ok: boolean; error?: string }> {
    return this.socket.timeout(5000).emitWithAck(ALARM_LIVE_EVENTS.subscribe, { reservoirId });
  }
  /** How many lists came so far: a mark to look for pushes after. */
  mark(): number {
    return this.lists.length;
  }
  /** Resolves with the first list pushed after the mark that passes the check. */
  async next(from: number, check: (l: AlarmList) => boolean): Promise<AlarmList> {
    let found: AlarmList | undefined;
    await eventually(() => {
      found = this.lists.slice(from).find(check);
      if (!found) throw new Error(`no such list among ${this.lists.length - from} pushed`);
    });
    return found!;
  }
}

/**
 * The alarm list pushed on the live socket, through the real gateway: alarms raised by readings
 * over a real broker and acknowledged over HTTP, each reaching a subscribed console as a whole list.
 */
describe('alarms live: subscribe -> list at once -> a new list on every change', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let field: TestField;
  let operator: SignedInUser;
  const sockets: Socket[] = [];

  const open = (auth?: Record<string, unknown>) => {
    const s = io(`${gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      reconnection: false,
      auth,
    });
    sockets.push(s);
    return s;
  };
  const connected = async (user: SignedInUser) => {
    const s = open({ token: user.token });
    const listener = new ListeningConsole(s);
    await new Promise<void>((resolve, reject) => {
      s.once('connect', () => resolve());
      s.once('connect_error', reject);
    });
    return listener;
  };
  const watchAlarm = (l: AlarmList) => l.alarms.find((a) => a.conditionId === 'pool-high.watch');

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    field = await TestField.start(gateway, broker.url);
    operator = await signInAs(gateway, 'operator');
  });

  afterAll(async () => {
    for (const s of sockets) s.close();
    await field?.stop();
    await gateway?.close();
    await broker?.stop();
  });

  it('refuses a socket without a token', async () => {
    const s = open();
    const message = await new Promise<string>((resolve, reject) => {
      s.once('connect', () => reject(new Error('connected')));
      s.once('connect_error', (e) => resolve(e.message));
    });
    expect(message).toBe('unauthenticated');
  });

  it('sends the list at once on subscribing, and a new one when real readings raise an alarm', async () => {
    const op = await connected(operator);
    expect(await op.subscribe()).toEqual({ ok: true });
    await eventually(() => expect(op.lists.length).toBeGreaterThanOrEqual(1));
    expect(op.lists[0]).toMatchObject({ reservoirId: RES });
    expect(watchAlarm(op.lists[0]!)).toBeUndefined();

    // above the watch level for longer than its on-delay, in site time
    const mark = op.mark();
    field.pool = WATCH.elevation + 0.3;
    await field.report();
    for (let minute = 1; minute <= 4; minute++) {
      field.advanceSiteClock(60_000);
      await field.report();
    }
    await gateway.app.get(AlarmsService).tick();
    const raised = await op.next(mark, (l) => watchAlarm(l)?.active === true);
    expect(watchAlarm(raised)).toMatchObject({ state: 'unacknowledged', priority: 'advisory' });
    expect(raised.counts.byPriority.advisory.unacknowledged).toBeGreaterThanOrEqual(1);
  });

  it('sends a new list when the alarm is acknowledged', async () => {
    const op = await connected(operator);
    await op.subscribe();
    const mark = op.mark();
    await request(gateway.url)
      .post(`/api/reservoirs/${RES}/alarms/pool-high.watch/acknowledge`)
      .set('Authorization', `Bearer ${operator.token}`)
      .send({ comment: 'inflow rising as forecast' })
      .expect(200);
    const acked = await op.next(mark, (l) => watchAlarm(l)?.acknowledged === true);
    expect(watchAlarm(acked)).toMatchObject({ state: 'acknowledged', acknowledgedBy: 'operator' });
  });

  it('refuses the roles without alarms.read and pushes nothing to them', async () => {
    const op = await connected(operator);
    await op.subscribe();
    // stakeholder and admin hold no alarms.read (shared/src/access/permissions.ts)
    const outsiders = await Promise.all(
      (['stakeholder', 'admin'] as const).map(async (r) => connected(await signInAs(gateway, r))),
    );
    for (const o of outsiders)
      expect(await o.subscribe()).toEqual({ ok: false, error: 'forbidden' });
    const unknown = await op.subscribe('no-such-reservoir');
    expect(unknown).toEqual({ ok: false, error: 'No reservoir "no-such-reservoir"' });

    // a change reaches the operator's socket; the outsiders' got no list at all
    const mark = op.mark();
    await gateway.app.get(AlarmsService).raise(RES, 'gate-not-following.gate-2', {
      message: 'gate 2 at 1.2 m, commanded 4.5 m',
      value: 1.2,
      limit: 4.5,
    });
    await op.next(mark, (l) =>
      l.alarms.some((a) => a.conditionId === 'gate-not-following.gate-2' && a.active),
    );
    expect(outsiders.map((o) => o.lists.length)).toEqual([0, 0]);
  });

  it('stops pushing after unsubscribing', async () => {
    const [stays, leaves] = [await connected(operator), await connected(operator)];
    await stays.subscribe();
    await leaves.subscribe();
    expect(
      await leaves.socket
        .timeout(5000)
        .emitWithAck(ALARM_LIVE_EVENTS.unsubscribe, { reservoirId: RES }),
    ).toEqual({ ok: true });
    const before = leaves.mark();
    const mark = stays.mark();
    await gateway.app
      .get(AlarmsService)
      .clear(RES, 'gate-not-following.gate-2', { message: 'at 4.5 m' });
    // both sockets would get the same emit of the room; the one that stays has it
    await stays.next(mark, (l) =>
      l.alarms.some((a) => a.conditionId === 'gate-not-following.gate-2' && !a.active),
    );
    expect(leaves.lists.length).toBe(before);
  });
});
