import type { Order } from '@stillwell/shared/orders';
import { InterlocksService } from '../../src/orders/interlocks.service';
import { OrderStore } from '../../src/orders/order-store';
import { api, authorised, oneGate, RES, startOrdersWorld, type OrdersWorld } from './setup';

const refusal = async (world: OrdersWorld, order: Order) => {
  const res = await api(world, world.users.operator).post(`/orders/${order.id}/execute`);
  expect([res.status, res.body.code]).toEqual([422, 'interlock']);
  return res.body as {
    message: string;
    interlocks: { results: Array<{ code: string; ok: boolean; message: string }> };
  };
};
const failed = (body: Awaited<ReturnType<typeof refusal>>) =>
  body.interlocks.results.filter((r) => !r.ok).map((r) => r.code);

describe('gate orders: each interlock refuses with a reason the operator can act on', () => {
  let world: OrdersWorld;
  beforeAll(async () => {
    world = await startOrdersWorld();
  });
  afterAll(() => world?.close());

  it('an order below every zone threshold needs no notice: the downstream check says so and allows', async () => {
    const order = await authorised(world, oneGate('gate-1', 0.5));
    expect(order.impact!.expectedRelease).toBeLessThan(150); // Quarry Road, the lowest demo threshold
    const res = await api(world, world.users.operator)
      .get(`/orders/${order.id}/interlocks`)
      .expect(200);
    expect(res.body.ok).toBe(true);
    expect(
      res.body.results.find((r: { code: string }) => r.code === 'downstream-clearance'),
    ).toMatchObject({
      ok: true,
      message: expect.stringMatching(/no downstream zone is affected/i),
    });
  });

  it('downstream notices not sent: refused, naming the zone, and nothing is sent', async () => {
    const order = await authorised(world, oneGate('gate-3', 2.3));
    expect(order.impact!.expectedRelease).toBeGreaterThan(150);
    const body = await refusal(world, order);
    expect(failed(body)).toEqual(['downstream-clearance']);
    expect(body.message).toMatch(/Quarry Road construction site has not been sent its notice/);
    expect(body.message).toMatch(new RegExp(`See the downstream notices of order ${order.id}`));
    expect(world.field.commands).toHaveLength(0);
  });

  it('stale telemetry: names the gate and the pool, and what to do', async () => {
    const order = await authorised(world, oneGate('gate-1', 0.5));
    world.field.advanceSiteClock(10 * 60_000);
    const body = await refusal(world, order);
    expect(failed(body)).toContain('telemetry-stale');
    expect(body.message).toMatch(/Gate 1 .*: its position reading is \d+\.\d min old/);
    expect(body.message).toMatch(/the pool: no fresh, good reading/);
    expect(body.message).toMatch(/Restore the gate controller's or gauge's link/);
    expect(world.field.commands).toHaveLength(0);
    await world.field.report();
    await api(world, world.users.operator).post(`/orders/${order.id}/execute`).expect(200);
  });

  it('the gate is already moving: refused until it stops', async () => {
    const order = await authorised(world, oneGate('gate-2', 2));
    await world.field.move('gate-2', 0.4);
    await world.field.move('gate-2', 0.45);
    const body = await refusal(world, order);
    expect(failed(body)).toEqual(['gate-moving']);
    expect(body.message).toMatch(
      /Gate 2 .* is moving \(0\.40 m to 0\.45 m in its last reports\)\. Wait until it has stopped/,
    );
    await world.field.move('gate-2', 0.45);
    await api(world, world.users.operator).post(`/orders/${order.id}/execute`).expect(200);
  });

  it('another order is still driving the gate: refused, naming that order', async () => {
    const all = (await api(world, world.users.operator).get(`/reservoirs/${RES}/orders`))
      .body as Order[];
    const busy = all.find(
      (o) =>
        ['dispatched', 'travelling'].includes(o.state) &&
        o.steps[0]!.targets[0]!.control === 'gate-2',
    )!;
    expect(busy).toBeDefined();
    const order = await authorised(world, oneGate('gate-2', 1));
    const body = await refusal(world, order);
    expect(body.message).toMatch(new RegExp(`Gate 2 .* is being moved by order ${busy.id}`));
  });

  it('the change of release exceeds the allowed rate: move fewer gates at once', async () => {
    await world.field.move('gate-3', 0);
    const order = await authorised(world, {
      reason: 'open every gate at once',
      steps: [
        {
          offsetMin: 0,
          targets: [
            { control: 'gate-3', target: 9 },
            { control: 'low-level-outlet', target: 100 },
            { control: 'gate-1', target: 9 },
          ],
        },
      ],
    });
    const body = await refusal(world, order);
    expect(failed(body)).toEqual(expect.arrayContaining(['release-rate']));
    expect(body.message).toMatch(
      /at up to \d+ m3\/s per minute; the allowed rate is 60 m3\/s per minute\. Move fewer gates at once/,
    );
  });

  it('a target outside the limits (the definition changed after the draft) is refused at execution', async () => {
    const order = await authorised(world, oneGate('gate-3', 2));
    // the limits live in the definition: evaluate the check itself with a target past them
    const stored = await world.gateway.app.get(OrderStore).view(order.id);
    const tooFar = {
      ...stored,
      steps: [{ offsetMin: 0, targets: [{ control: 'gate-3', target: 9.5 }] }],
    };
    const { report } = await world.gateway.app.get(InterlocksService).evaluate(tooFar, 0, true);
    const limit = report.results.find((r) => r.code === 'target-out-of-limits')!;
    expect(report.ok).toBe(false);
    expect(limit).toMatchObject({ ok: false, waived: false });
    expect(limit.message).toMatch(
      /Gate 3 .*: 9\.5 m is outside its limits 0\.\.9 m\. Choose a target within the gate's travel/,
    );
  });
});
