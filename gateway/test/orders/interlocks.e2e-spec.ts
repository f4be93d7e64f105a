import { Injectable } from '@nestjs/common';
import type { Order } from '@stillwell/shared/orders';
import {
  DOWNSTREAM_CLEARANCE,
  type DownstreamClearance,
} from '../../src/orders/downstream-clearance';
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

  it('says by default that there is no downstream notice registry yet, and lets the order go', async () => {
    const order = await authorised(world, oneGate('gate-1', 0.5));
    const res = await api(world, world.users.operator)
      .get(`/orders/${order.id}/interlocks`)
      .expect(200);
    expect(res.body.ok).toBe(true);
    expect(
      res.body.results.find((r: { code: string }) => r.code === 'downstream-clearance').message,
    ).toMatch(/no downstream notice registry yet/);
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

@Injectable()
class NoticesNotSent implements DownstreamClearance {
  check(order: Order) {
    return {
      ok: false as const,
      reason: `Hessford (14 km) has not acknowledged the notice for order ${order.id}; its 90 min lead time has not run`,
    };
  }
}

describe('gate orders: a downstream clearance that refuses blocks execution', () => {
  let world: OrdersWorld;
  beforeAll(async () => {
    world = await startOrdersWorld(
      {},
      { override: (b) => b.overrideProvider(DOWNSTREAM_CLEARANCE).useClass(NoticesNotSent) },
    );
  });
  afterAll(() => world?.close());

  it('refuses with the notices module reason, and sends nothing', async () => {
    const order = await authorised(world, oneGate('gate-1', 0.5));
    const body = await refusal(world, order);
    expect(failed(body)).toEqual(['downstream-clearance']);
    expect(body.message).toMatch(
      /Hessford \(14 km\) has not acknowledged the notice for order \d+; its 90 min lead time has not run/,
    );
    expect(world.field.commands).toHaveLength(0);
  });

  it('under a declared emergency the check is waived, recorded, and the order awaits countersignature', async () => {
    const order = await authorised(world, oneGate('gate-1', 0.5));
    await api(world, world.users.engineer)
      .post(`/reservoirs/${RES}/emergency`, { level: 2, reason: 'inflow far above the forecast' })
      .expect(200);
    const res = await api(world, world.users.operator)
      .post(`/orders/${order.id}/execute`)
      .expect(200);
    expect(res.body).toMatchObject({
      emergency: true,
      awaitingCountersign: true,
      execution: { waived: ['downstream-clearance'] },
    });
    expect(res.body.execution.clearance).toMatch(/Hessford/);
  });
});
