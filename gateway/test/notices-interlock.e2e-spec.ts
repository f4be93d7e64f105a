import type { Notice } from '@stillwell/shared/notices';
import type { Order } from '@stillwell/shared/orders';
import { ClearanceService } from '../src/notices/clearance.service';
import { OrderNoticesListener } from '../src/notices/orders/order-notices.listener';
import { signInAs, type SignedInUser } from './support/auth';
import { eventually } from './support/gateway';
import { entries } from './support/notices';
import { api, draft, oneGate, RES, startOrdersWorld, type OrdersWorld } from './orders/setup';

const HOUR = 3_600_000;

/**
 * The lead-time interlock for real: DOWNSTREAM_CLEARANCE as the orders module binds it (the notices
 * module's check), real orders drafted and executed over a real broker, the site
 * clock moved by hand.
 */
describe('downstream clearance of gate orders', () => {
  let world: OrdersWorld;
  let liaison: SignedInUser;
  const settle = () => world.gateway.app.get(OrderNoticesListener).settled();
  const noticesOf = async (order: Order) =>
    (await api(world, liaison).get(`/reservoirs/${RES}/notices?orderId=${order.id}`).expect(200))
      .body as Notice[];
  const clearanceOf = async (order: Order) => {
    const res = await api(world, world.users.operator)
      .get(`/orders/${order.id}/interlocks`)
      .expect(200);
    return (
      res.body.results as Array<{ code: string; ok: boolean; waived: boolean; message: string }>
    ).find((r) => r.code === 'downstream-clearance')!;
  };

  beforeAll(async () => {
    world = await startOrdersWorld({
      NOTICE_TICK_MS: '0',
      DEMO_SMTP_PORT: '0',
      ORDER_AUTHORISATION_TTL_MIN: '600',
    });
    liaison = await signInAs(world.gateway, 'liaison');
  });
  afterAll(() => world?.close());

  it('prepares the notices when an order is drafted, and refuses execution until lead time has run', async () => {
    const order = await draft(
      world,
      oneGate('gate-1', 2.3, 'draw down ahead of the forecast peak'),
    );
    const release = order.impact!.expectedRelease;
    // between the work site's threshold (150) and the campground's (250): only Quarry Road is affected
    expect(release).toBeGreaterThan(150);
    expect(release).toBeLessThan(250);
    await settle();
    const notices = await noticesOf(order);
    expect(notices.map((n) => [n.zoneName, n.state])).toEqual([
      ['Quarry Road construction site', 'prepared'],
    ]);
    expect(notices[0]!.releaseM3s).toBeCloseTo(release, 6);

    await api(world, world.users.engineer)
      .post(`/orders/${order.id}/authorise`, { comment: 'checked against the forecast' })
      .expect(200);
    const before = await clearanceOf(order);
    expect(before).toMatchObject({ ok: false, waived: false });
    expect(before.message).toMatch(/Quarry Road construction site has not been sent its notice/);
    const refused = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
    expect([refused.status, refused.body.code]).toEqual([422, 'interlock']);
    expect(world.field.commands).toHaveLength(0);

    const sent = (await api(world, liaison).post(`/notices/${notices[0]!.id}/send`).expect(200))
      .body as Notice;
    expect(sent.recipients.map((r) => [r.person, r.delivery])).toEqual([
      ['Juno Ashgrove', 'delivered'],
    ]);
    const running = await clearanceOf(order);
    expect(running.ok).toBe(false);
    expect(running.message).toMatch(
      /Juno Ashgrove \(Quarry Road construction site\) is still within its lead time/,
    );
    await api(world, world.users.operator).post(`/orders/${order.id}/execute`).expect(422);

    world.field.advanceSiteClock(HOUR - 60_000);
    await world.field.report();
    expect((await clearanceOf(order)).ok).toBe(false);
    world.field.advanceSiteClock(60_000);
    await world.field.report();
    const clear = await clearanceOf(order);
    expect(clear.ok).toBe(true);
    expect(clear.message).toMatch(/^Downstream is clear/);
    await api(world, world.users.operator).post(`/orders/${order.id}/execute`).expect(200);
    // the command reaches the field's controller over the broker
    await eventually(() => expect(world.field.commands).toHaveLength(1));
  });

  it('withdraws the unsent notices of an order that is withdrawn', async () => {
    const order = await draft(world, oneGate('gate-3', 2.3));
    await settle();
    expect((await noticesOf(order)).map((n) => n.state)).toEqual(['prepared']);
    await api(world, world.users.operator)
      .post(`/orders/${order.id}/withdraw`, { comment: 'inflow eased off' })
      .expect(200);
    await settle();
    expect((await noticesOf(order)).map((n) => n.state)).toEqual(['withdrawn']);
  });

  it('under a declared emergency: notices go out at once, the order runs, and the shortfall is logged', async () => {
    await api(world, world.users.engineer)
      .post(`/reservoirs/${RES}/emergency`, { level: 2, reason: 'inflow far above the forecast' })
      .expect(200);
    const order = await draft(
      world,
      oneGate('gate-2', 2.3, 'emergency release to protect the crest'),
    );
    await settle();
    const notices = await noticesOf(order);
    expect(notices.map((n) => [n.state, n.emergency])).toEqual([['sent', true]]);
    expect(notices[0]!.recipients[0]).toMatchObject({
      person: 'Juno Ashgrove',
      delivery: 'delivered',
    });

    const waived = await clearanceOf(order);
    expect(waived).toMatchObject({ ok: false, waived: true });
    const executed = await api(world, world.users.operator)
      .post(`/orders/${order.id}/execute`)
      .expect(200);
    expect((executed.body as Order).execution!.waived).toContain('downstream-clearance');
    await settle();
    const shortfalls = await entries(world.gateway, 'notice.lead-time-shortfall');
    expect(shortfalls).toHaveLength(1);
    expect(shortfalls[0]!.payload).toMatchObject({ orderId: String(order.id) });
    const [short] = shortfalls[0]!.payload.shortfalls as Array<{
      contactName: string;
      reason: string;
      shortS: number;
    }>;
    expect(short).toMatchObject({ contactName: 'Juno Ashgrove', reason: 'lead-time-running' });
    expect(short!.shortS).toBeGreaterThan(3500);
    expect(short!.shortS).toBeLessThanOrEqual(3600);
    // the clearance service itself reads the same way for any caller
    const verdict = await world.gateway.app.get(ClearanceService).check({
      orderId: String(order.id),
      reservoirId: RES,
      targetReleaseM3s: order.impact!.expectedRelease,
      currentReleaseM3s: order.impact!.currentRelease,
      plannedStartAt: null,
      durationS: null,
      emergency: true,
    });
    expect(verdict).toMatchObject({ clear: true, emergency: true });
  });
});
