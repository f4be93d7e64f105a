import type { Order } from '@stillwell/shared/orders';
import { LogbookService } from '../../src/logbook/logbook.service';
import { eventually } from '../support/gateway';
import {
  api,
  authorised,
  draft,
  entriesOf,
  oneGate,
  RES,
  startOrdersWorld,
  sweep,
  type OrdersWorld,
} from './setup';

describe('gate orders: the two-person rule, enforced by the gateway', () => {
  let world: OrdersWorld;
  beforeAll(async () => {
    world = await startOrdersWorld();
  });
  afterAll(() => world?.close());

  it('an operator drafts: the order waits for review with its routed effect attached', async () => {
    const order = await draft(world, oneGate('gate-1', 1.5));
    expect(order).toMatchObject({
      state: 'proposed',
      author: { username: 'operator' },
      emergency: false,
    });
    expect(order.impact).toMatchObject({
      pool: 205,
      inflow: 600,
      currentRelease: expect.any(Number),
    });
    expect(order.impact!.expectedRelease).toBeGreaterThan(order.impact!.currentRelease);
    expect(order.impact!.peakWith!.elevation).toBeLessThanOrEqual(
      order.impact!.peakWithout!.elevation,
    );
    const kinds = (await entriesOf(world, order.id)).map((e) => e.kind);
    expect(kinds).toEqual(['order.drafted']);
  });

  it('refuses a bad draft naming each field, and a target outside the gate limits', async () => {
    const res = await api(world, world.users.operator).post(`/reservoirs/${RES}/orders`, {
      reason: 'x',
      steps: [{ offsetMin: 0, targets: [{ control: 'gate-1', target: -2 }] }],
    });
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('invalid-order');
    expect(res.body.message).toMatch(/reason: at least 5 characters/);
    expect(res.body.message).toMatch(/steps\.0\.targets\.0\.target: an opening cannot be negative/);
    const far = await api(world, world.users.operator).post(
      `/reservoirs/${RES}/orders`,
      oneGate('gate-2', 9.5),
    );
    expect([far.status, far.body.code]).toEqual([400, 'invalid-order']);
    expect(far.body.message).toMatch(
      /steps\.0\.targets\.0\.target: Gate 2 .*9\.5 m is outside its limits 0\.\.9 m/,
    );
  });

  it('an operator cannot authorise at all', async () => {
    const order = await draft(world, oneGate('gate-1', 1));
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/authorise`, {
      comment: 'looks fine',
    });
    expect([res.status, res.body.code]).toEqual([403, 'forbidden']);
    expect((await api(world, world.users.operator).get(`/orders/${order.id}`)).body.state).toBe(
      'proposed',
    );
  });

  it('the author cannot authorise their own order straight through the API, even holding the engineer role', async () => {
    const order = await draft(world, oneGate('gate-1', 1), world.users.dual);
    const res = await api(world, world.users.dual).post(`/orders/${order.id}/authorise`, {
      comment: 'mine, fine',
    });
    expect([res.status, res.body.code]).toEqual([403, 'own-order']);
    expect(res.body.message).toMatch(/another duty engineer must review it/);
    const declined = await api(world, world.users.dual).post(`/orders/${order.id}/decline`, {
      comment: 'mine',
    });
    expect(declined.body.code).toBe('own-order');
    // another engineer may
    const ok = await api(world, world.users.engineer).post(`/orders/${order.id}/authorise`, {
      comment: 'agreed',
    });
    expect(ok.status).toBe(200);
    expect(ok.body.decision).toMatchObject({
      outcome: 'authorised',
      by: { username: 'engineer' },
      comment: 'agreed',
    });
  });

  it('authorising needs identity confirmed again (step-up)', async () => {
    const order = await draft(world, oneGate('gate-1', 1));
    const res = await api(world, world.users.engineer2).post(`/orders/${order.id}/authorise`, {
      comment: 'ok',
    });
    expect([res.status, res.body.code]).toEqual([403, 'step-up-required']);
  });

  it('a declined order cannot be executed', async () => {
    const order = await draft(world, oneGate('gate-1', 1));
    await api(world, world.users.engineer)
      .post(`/orders/${order.id}/decline`, { comment: 'wait for the next forecast' })
      .expect(200);
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect([res.status, res.body.code]).toEqual([409, 'wrong-state']);
    expect(res.body.message).toMatch(/declined by engineer: "wait for the next forecast"/);
    expect(world.field.commands).toHaveLength(0);
  });

  it('a proposed order cannot be executed without a declared emergency', async () => {
    const order = await draft(world, oneGate('gate-1', 1));
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect([res.status, res.body.code]).toEqual([409, 'not-authorised']);
  });

  it('an expired authorisation cannot be executed, and lapses (site time)', async () => {
    const order = await authorised(world, oneGate('gate-1', 1));
    expect(Date.parse(order.authorisedUntil!) - Date.parse(order.decision!.at)).toBe(30 * 60_000);
    world.field.advanceSiteClock(30 * 60_000 + 1000);
    await world.field.report();
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect([res.status, res.body.code]).toEqual([409, 'authorisation-lapsed']);
    await sweep(world);
    const after = (await api(world, world.users.operator).get(`/orders/${order.id}`)).body as Order;
    expect(after.state).toBe('lapsed');
    expect((await entriesOf(world, order.id)).map((e) => e.kind)).toEqual([
      'order.drafted',
      'order.authorised',
      'order.lapsed',
    ]);
    expect(world.field.commands).toHaveLength(0);
  });

  it('runs the whole way: authorised, executed, acknowledged, travelling, in position, every step logged', async () => {
    const order = await authorised(world, oneGate('gate-3', 2));
    const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect(res.status).toBe(200);
    const command = world.field.lastCommand();
    expect(command).toEqual({
      commandId: expect.stringMatching(new RegExp(`^go-${order.id}-s1-`)),
      gates: { 'gate-3': 2 },
    });
    const read = async () =>
      (await api(world, world.users.operator).get(`/orders/${order.id}`)).body as Order;
    // the controller acknowledged at once (the field obeys): travelling
    await eventually(async () => expect((await read()).state).toBe('travelling'));
    await world.field.move('gate-3', 1.2);
    await sweep(world);
    expect((await read()).state).toBe('travelling');
    await world.field.move('gate-3', 1.98);
    await eventually(async () => expect((await read()).state).toBe('in-position'));
    const done = await read();
    expect(done.commands[0]).toMatchObject({
      commandId: command.commandId,
      state: 'in-position',
      from: { 'gate-3': 0 },
    });
    expect((await entriesOf(world, order.id)).map((e) => e.kind)).toEqual([
      'order.drafted',
      'order.authorised',
      'order.executed',
      'command.sent',
      'command.acknowledged',
      'order.in-position',
    ]);
    expect((await world.gateway.app.get(LogbookService).verify()).ok).toBe(true);
  });
});
