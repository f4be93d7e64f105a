import { io, type Socket } from 'socket.io-client';
import { LOGBOOK_LIVE_EVENTS, type LogbookEntry } from '@stillwell/shared/logbook';
import {
  ORDER_LIVE_EVENTS,
  type AutomaticRule,
  type AutomationView,
  type Emergency,
  type Order,
} from '@stillwell/shared/orders';
import { LIVE_NAMESPACE } from '@stillwell/shared/telemetry';
import { LogbookQueryService } from '../../src/logbook/logbook-query.service';
import { signInAs, stepUp } from '../support/auth';
import { eventually } from '../support/gateway';
import { api, draft, entriesOf, oneGate, RES, startOrdersWorld, type OrdersWorld } from './setup';

describe('gate orders: the emergency path', () => {
  let world: OrdersWorld;
  beforeAll(async () => {
    world = await startOrdersWorld();
  });
  afterAll(() => world?.close());

  const awaiting = async () =>
    (
      (
        await api(world, world.users.engineer).get(
          `/reservoirs/${RES}/orders?awaitingCountersign=true`,
        )
      ).body as Order[]
    ).map((o) => o.id);

  it('declaring is a stepped-up act of a duty engineer only, and is logged', async () => {
    const body = { level: 2, reason: 'inflow far above the forecast; spillway capacity at risk' };
    // the matrix lets an operator declare; the orders module keeps it to engineers
    await stepUp(world.gateway, world.users.operator);
    const byOperator = await api(world, world.users.operator).post(
      `/reservoirs/${RES}/emergency`,
      body,
    );
    expect([byOperator.status, byOperator.body.code]).toEqual([403, 'engineer-required']);
    const notStepped = await api(world, world.users.engineer2).post(
      `/reservoirs/${RES}/emergency`,
      body,
    );
    expect([notStepped.status, notStepped.body.code]).toEqual([403, 'step-up-required']);
    const bad = await api(world, world.users.engineer).post(`/reservoirs/${RES}/emergency`, {
      level: 7,
      reason: '',
    });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/level: .*; reason: at least 5 characters/);
    expect(
      (await api(world, world.users.operator).get(`/reservoirs/${RES}/emergency`)).body,
    ).toEqual({ emergency: null });
  });

  it('executes without authorisation only under a declared emergency, and lists it for countersignature', async () => {
    const order = await draft(world, oneGate('gate-1', 1));
    const before = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect([before.status, before.body.code]).toEqual([409, 'not-authorised']);

    const declared = await api(world, world.users.engineer)
      .post(`/reservoirs/${RES}/emergency`, { level: 2, reason: 'inflow far above the forecast' })
      .expect(200);
    expect((declared.body as Emergency).declaredBy.username).toBe('engineer');
    const again = await api(world, world.users.engineer).post(`/reservoirs/${RES}/emergency`, {
      level: 3,
      reason: 'again, higher',
    });
    expect([again.status, again.body.code]).toEqual([409, 'emergency-active']);

    const res = await api(world, world.users.operator)
      .post(`/orders/${order.id}/execute`)
      .expect(200);
    expect(res.body).toMatchObject({
      emergency: true,
      awaitingCountersign: true,
      emergencyId: declared.body.id,
      decision: null,
    });
    expect(await awaiting()).toEqual([order.id]);
    const executed = (await entriesOf(world, order.id)).find((e) => e.kind === 'order.executed')!;
    expect(executed.payload).toMatchObject({
      withoutAuthorisation: true,
      emergency: true,
      emergencyId: declared.body.id,
    });
  });

  it('stays on the countersign list until a duty engineer who took no part countersigns it', async () => {
    const [id] = await awaiting();
    const byOperator = await api(world, world.users.operator).post(`/orders/${id}/countersign`, {
      comment: 'seen',
    });
    expect([byOperator.status, byOperator.body.code]).toEqual([403, 'forbidden']);
    const ok = await api(world, world.users.engineer)
      .post(`/orders/${id}/countersign`, { comment: 'right call given the inflow' })
      .expect(200);
    expect(ok.body).toMatchObject({
      awaitingCountersign: false,
      countersign: { by: { username: 'engineer' } },
    });
    expect(await awaiting()).toEqual([]);
    const twice = await api(world, world.users.engineer).post(`/orders/${id}/countersign`, {
      comment: 'again',
    });
    expect([twice.status, twice.body.code]).toEqual([409, 'countersign-not-needed']);
    expect((await entriesOf(world, id!)).map((e) => e.kind)).toContain('order.countersigned');
  });

  it('an engineer who ran the emergency order cannot countersign it', async () => {
    const order = await draft(world, oneGate('gate-2', 0.5), world.users.dual);
    await world.field.report();
    await api(world, world.users.dual).post(`/orders/${order.id}/execute`).expect(200);
    const self = await api(world, world.users.dual).post(`/orders/${order.id}/countersign`, {
      comment: 'mine',
    });
    expect([self.status, self.body.code]).toEqual([403, 'countersign-self']);
  });

  it('ending the emergency is logged, and the usual rule is back', async () => {
    await api(world, world.users.engineer)
      .post(`/reservoirs/${RES}/emergency/end`, {
        reason: 'inflow receding; back to normal operation',
      })
      .expect(200);
    expect(
      (await api(world, world.users.operator).get(`/reservoirs/${RES}/emergency`)).body,
    ).toEqual({ emergency: null });
    const order = await draft(world, oneGate('gate-3', 0.5));
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect(res.body.code).toBe('not-authorised');
    const { rows } = await world.gateway.app.get(LogbookQueryService).page({ kind: 'emergency.' });
    expect(rows.map((e) => e.kind).sort()).toEqual(['emergency.declared', 'emergency.ended']);
  });
});

describe('automatic rules and the live feeds', () => {
  let world: OrdersWorld;
  let socket: Socket;
  const entries: LogbookEntry[] = [];
  const rules: AutomaticRule[] = [];
  beforeAll(async () => {
    world = await startOrdersWorld();
    socket = io(`${world.gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: world.users.reviewer.token },
    });
    socket.on(LOGBOOK_LIVE_EVENTS.entry, (e: LogbookEntry) => entries.push(e));
    socket.on(ORDER_LIVE_EVENTS.automation, (r: AutomaticRule) => rules.push(r));
    expect(await socket.timeout(5000).emitWithAck(LOGBOOK_LIVE_EVENTS.follow)).toEqual({
      ok: true,
    });
    expect(
      await socket.timeout(5000).emitWithAck(ORDER_LIVE_EVENTS.subscribe, { reservoirId: RES }),
    ).toEqual({ ok: true });
  });
  afterAll(async () => {
    socket?.close();
    await world?.close();
  });

  it('only a stepped-up duty engineer changes a rule; the controller gets it retained and answers', async () => {
    const body = { enabled: true, riseAbove: 208.5, target: 4 };
    const byOperator = await api(world, world.users.operator).put(
      `/reservoirs/${RES}/automation/gate-3`,
      body,
    );
    expect([byOperator.status, byOperator.body.code]).toEqual([403, 'forbidden']);
    const notStepped = await api(world, world.users.engineer2).put(
      `/reservoirs/${RES}/automation/gate-3`,
      body,
    );
    expect(notStepped.body.code).toBe('step-up-required');
    const bad = await api(world, world.users.engineer).put(`/reservoirs/${RES}/automation/gate-3`, {
      ...body,
      target: 10,
    });
    expect([bad.status, bad.body.code]).toEqual([400, 'rule-invalid']);
    expect(bad.body.message).toMatch(/target: 10 m is outside Gate 3 .* limits 0\.\.9 m/);

    const res = await api(world, world.users.engineer)
      .put(`/reservoirs/${RES}/automation/gate-3`, body)
      .expect(200);
    const rule = res.body as AutomaticRule;
    expect(rule).toMatchObject({
      enabled: true,
      riseAbove: 208.5,
      target: 4,
      device: { state: 'pending' },
      updatedBy: { username: 'engineer' },
    });
    await eventually(() =>
      expect(world.field.rules.at(-1)).toEqual({
        revision: rule.revision,
        rules: [{ control: 'gate-3', ...body }],
      }),
    );

    await world.field.ruleEvent({
      eventId: 'gc-1',
      kind: 'applied',
      revision: rule.revision,
      time: new Date().toISOString(),
    });
    await eventually(async () => {
      const view = (await api(world, world.users.operator).get(`/reservoirs/${RES}/automation`))
        .body as AutomationView;
      expect(view.rules.find((r) => r.control === 'gate-3')!.device.state).toBe('applied');
      expect(view.rules.find((r) => r.control === 'gate-1')!.device.state).toBe('not-configured');
    });
    await eventually(() => expect(rules.at(-1)?.device.state).toBe('applied'));
  });

  it('records each automatic move once, in the logbook, live', async () => {
    const event = {
      eventId: 'gc-2',
      kind: 'triggered',
      revision: 1,
      control: 'gate-3',
      pool: 208.51,
      target: 4,
      time: new Date().toISOString(),
    };
    await world.field.ruleEvent(event);
    await world.field.ruleEvent(event);
    await eventually(async () => {
      const view = (await api(world, world.users.operator).get(`/reservoirs/${RES}/automation`))
        .body as AutomationView;
      expect(view.rules.find((r) => r.control === 'gate-3')!.lastTriggeredAt).not.toBeNull();
      expect(view.events.filter((e) => e.eventId === 'gc-2')).toHaveLength(1);
    });
    await eventually(() => expect(entries.map((e) => e.kind)).toContain('automation.triggered'));
    const { rows } = await world.gateway.app
      .get(LogbookQueryService)
      .page({ kind: 'automation.triggered', gate: 'gate-3' });
    expect(rows).toHaveLength(1);
    expect(rows[0]!.payload).toMatchObject({ pool: 208.51, target: 4, by: 'gate controller' });
    expect(entries.map((e) => e.kind)).toEqual(
      expect.arrayContaining(['config.automatic-rule', 'automation.applied']),
    );
  });

  it('pushes each new entry after its commit, in order, with nothing lost', async () => {
    const seen = entries.length;
    await stepUp(world.gateway, world.users.engineer);
    await draft(world, oneGate('gate-1', 0.3));
    await eventually(() =>
      expect(entries.slice(seen).map((e) => e.kind)).toContain('order.drafted'),
    );
    const seqs = entries.map((e) => e.seq);
    expect(seqs).toEqual([...seqs].sort((a, b) => a - b));
    expect(new Set(seqs).size).toBe(seqs.length);
  });

  it('refuses the logbook feed to a role without logbook.read', async () => {
    const stakeholder = await signInAs(world.gateway, 'stakeholder');
    const s = io(`${world.gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: stakeholder.token },
    });
    try {
      expect(await s.timeout(5000).emitWithAck(LOGBOOK_LIVE_EVENTS.follow)).toEqual({
        ok: false,
        error: 'forbidden',
      });
      expect(
        await s.timeout(5000).emitWithAck(ORDER_LIVE_EVENTS.subscribe, { reservoirId: RES }),
      ).toEqual({ ok: false, error: 'forbidden' });
    } finally {
      s.close();
    }
  });
});
