import { io, type Socket } from 'socket.io-client';
import { ORDER_LIVE_EVENTS, type Order, type OrderAlarm } from '@stillwell/shared/orders';
import { LIVE_NAMESPACE } from '@stillwell/shared/telemetry';
import { eventually } from '../support/gateway';
import {
  api,
  authorised,
  entriesOf,
  oneGate,
  RES,
  startOrdersWorld,
  sweep,
  type OrdersWorld,
} from './setup';

describe('gate orders: commands, acknowledgements and the alarms when they fail', () => {
  let world: OrdersWorld;
  let socket: Socket;
  const alarms: OrderAlarm[] = [];
  const pushed: Order[] = [];

  beforeAll(async () => {
    world = await startOrdersWorld({ ORDER_ACK_TIMEOUT_MS: '1000', ORDER_FOLLOW_GRACE_S: '60' });
    socket = io(`${world.gateway.url}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: world.users.operator.token },
    });
    socket.on(ORDER_LIVE_EVENTS.alarm, (a: OrderAlarm) => alarms.push(a));
    socket.on(ORDER_LIVE_EVENTS.order, (o: Order) => pushed.push(o));
    const ack = await socket
      .timeout(5000)
      .emitWithAck(ORDER_LIVE_EVENTS.subscribe, { reservoirId: RES });
    expect(ack).toEqual({ ok: true });
  });
  afterAll(async () => {
    socket?.close();
    await world?.close();
  });

  const read = async (id: number) =>
    (await api(world, world.users.operator).get(`/orders/${id}`)).body as Order;
  const execute = (id: number) => api(world, world.users.operator).post(`/orders/${id}/execute`);

  it('a lost acknowledgement: sent again under the same id, then the alarm record at the timeout', async () => {
    world.field.mode = 'silent';
    const order = await authorised(world, oneGate('gate-1', 1));
    await execute(order.id).expect(200);
    const sentAt = Date.now();
    const first = world.field.lastCommand();
    // before half the timeout nothing happens
    await sweep(world, sentAt + 100);
    expect(world.field.commands.filter((c) => c.commandId === first.commandId)).toHaveLength(1);
    await sweep(world, sentAt + 600);
    await eventually(() =>
      expect(world.field.commands.filter((c) => c.commandId === first.commandId)).toHaveLength(2),
    );
    expect((await read(order.id)).state).toBe('dispatched');
    await sweep(world, sentAt + 1100);
    const faulted = await read(order.id);
    expect(faulted.state).toBe('faulted');
    expect(faulted.fault).toMatchObject({
      code: 'ack-missing',
      detail: expect.stringMatching(/no acknowledgement of go-/),
    });
    expect((await entriesOf(world, order.id)).map((e) => e.kind)).toEqual([
      'order.drafted',
      'order.authorised',
      'order.executed',
      'command.sent',
      'command.resent',
      'order.ack-missing',
    ]);
    await eventually(() =>
      expect(alarms.map((a) => [a.kind, a.orderId])).toContainEqual([
        'order.ack-missing',
        order.id,
      ]),
    );
    expect(pushed.filter((o) => o.id === order.id).at(-1)?.state).toBe('faulted');
  });

  it('a late acknowledgement is recorded, and the order stays faulted', async () => {
    const order = (
      await api(world, world.users.operator).get(`/reservoirs/${RES}/orders?state=faulted`)
    ).body[0] as Order;
    const commandId = order.commands[0]!.commandId;
    await world.field.client.publishAsync(
      `stillwell/v1/${RES}/ack/gate-controller`,
      JSON.stringify({ commandId, status: 'accepted', time: new Date().toISOString() }),
      { qos: 1 },
    );
    await eventually(async () =>
      expect((await entriesOf(world, order.id)).at(-1)).toMatchObject({
        kind: 'command.acknowledged',
        payload: { late: true },
      }),
    );
    expect((await read(order.id)).state).toBe('faulted');
  });

  it('a refused command faults the order with the controller reason', async () => {
    world.field.mode = 'reject';
    const order = await authorised(world, oneGate('gate-2', 1));
    await execute(order.id).expect(200);
    await eventually(async () => expect((await read(order.id)).state).toBe('faulted'));
    expect((await read(order.id)).fault).toMatchObject({
      code: 'command-rejected',
      detail: expect.stringMatching(/hydraulic pressure low/),
    });
    await eventually(() =>
      expect(alarms.map((a) => [a.kind, a.orderId])).toContainEqual([
        'order.command-rejected',
        order.id,
      ]),
    );
  });

  it('a gate that does not follow raises order.not-following (site time)', async () => {
    world.field.mode = 'obey';
    // below every demo zone's threshold: this test is about the gate, not the notices
    const order = await authorised(world, oneGate('gate-2', 1.5));
    await execute(order.id).expect(200);
    await eventually(async () => expect((await read(order.id)).state).toBe('travelling'));
    // the controller said yes, but the gate stays shut while the site clock runs on
    world.field.advanceSiteClock(30_000);
    await world.field.report();
    await sweep(world);
    expect((await read(order.id)).state).toBe('travelling');
    world.field.advanceSiteClock(40_000);
    await world.field.report();
    await sweep(world);
    const faulted = await read(order.id);
    expect(faulted.state).toBe('faulted');
    expect(faulted.fault).toMatchObject({
      code: 'not-following',
      detail: expect.stringMatching(/Gate 2 .* has not moved towards 1\.5 m/),
    });
    expect((await entriesOf(world, order.id)).map((e) => e.kind)).toContain('order.not-following');
    await eventually(() =>
      expect(alarms.map((a) => [a.kind, a.orderId])).toContainEqual([
        'order.not-following',
        order.id,
      ]),
    );
  });

  it('a schedule: the next step waits for its time, is checked again, then sent', async () => {
    const order = await authorised(world, {
      reason: 'staged opening of gate 1 ahead of the peak',
      steps: [
        { offsetMin: 0, targets: [{ control: 'gate-1', target: 0.5 }] },
        { offsetMin: 20, targets: [{ control: 'gate-1', target: 1 }] },
      ],
    });
    await world.field.move('gate-1', 0);
    await execute(order.id).expect(200);
    await eventually(async () => expect((await read(order.id)).state).toBe('travelling'));
    await world.field.move('gate-1', 0.5);
    await eventually(async () => expect((await read(order.id)).state).toBe('holding'));
    const holding = await read(order.id);
    expect(Date.parse(holding.nextStepDue!) - Date.parse(holding.execution!.at)).toBe(20 * 60_000);
    const before = world.field.commands.length;
    await sweep(world);
    expect(world.field.commands).toHaveLength(before);
    world.field.advanceSiteClock(20 * 60_000);
    await world.field.report();
    await sweep(world);
    await eventually(() => expect(world.field.commands).toHaveLength(before + 1));
    expect(world.field.lastCommand()).toMatchObject({
      commandId: expect.stringMatching(new RegExp(`^go-${order.id}-s2-`)),
      gates: { 'gate-1': 1 },
    });
    await eventually(async () => expect((await read(order.id)).state).toBe('travelling'));
    await world.field.move('gate-1', 1);
    await eventually(async () => expect((await read(order.id)).state).toBe('in-position'));
    expect((await entriesOf(world, order.id)).map((e) => e.kind)).toEqual([
      'order.drafted',
      'order.authorised',
      'order.executed',
      'command.sent',
      'command.acknowledged',
      'order.step-in-position',
      'order.step-started',
      'command.sent',
      'command.acknowledged',
      'order.in-position',
    ]);
  });
});
