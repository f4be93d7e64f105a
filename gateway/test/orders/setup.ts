import request from 'supertest';
import type { Role } from '@stillwell/shared/access';
import type { CreateOrderRequest, Order } from '@stillwell/shared/orders';
import { LogbookQueryService } from '../../src/logbook/logbook-query.service';
import { OrderTicker } from '../../src/orders/order-ticker.service';
import { UsersService } from '../../src/users/users.service';
import { ACCESS_TEST_ENV, signIn, signInAs, stepUp, type SignedInUser } from '../support/auth';
import { startTestBroker, type TestBroker } from '../support/broker';
import { TestField } from '../support/field';
import { startTestGateway, type TestGateway } from '../support/gateway';

export const RES = 'lake-orrin';

export interface OrdersWorld {
  broker: TestBroker;
  gateway: TestGateway;
  field: TestField;
  users: Record<'operator' | 'engineer' | 'engineer2' | 'dual' | 'reviewer', SignedInUser>;
  close(): Promise<void>;
}

/** Calls the API as a signed-in user. */
export function api(world: OrdersWorld, user: SignedInUser) {
  const auth = (r: request.Test) => r.set('Authorization', `Bearer ${user.token}`);
  return {
    get: (path: string) => auth(request(world.gateway.url).get(`/api${path}`)),
    post: (path: string, body: object = {}) =>
      auth(request(world.gateway.url).post(`/api${path}`)).send(body),
    put: (path: string, body: object = {}) =>
      auth(request(world.gateway.url).put(`/api${path}`)).send(body),
  };
}

/** A person with an account of their own (the demo has one per role). */
async function account(
  gateway: TestGateway,
  username: string,
  roles: Role[],
): Promise<SignedInUser> {
  const password = `heron-over-the-sluice-${roles.length}-${Math.random().toString(36).slice(2, 8)}`;
  await gateway.app
    .get(UsersService)
    .create({ username, displayName: username, roles, password }, null, 'test');
  return signIn(gateway, username, password);
}

/**
 * One gateway on a real broker with the test's own field devices; the ticker is off (tick 0), so
 * each test drives deadlines by calling the sweep itself.
 */
export async function startOrdersWorld(
  env: Record<string, string> = {},
  imports: Parameters<typeof startTestGateway>[1] = {},
): Promise<OrdersWorld> {
  const broker = await startTestBroker();
  const gateway = await startTestGateway(
    {
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      ORDER_TICK_MS: '0',
      ORDER_ACK_TIMEOUT_MS: '1000',
      FORECAST_TICK_MS: '0',
      ...env,
    },
    imports,
  );
  const field = await TestField.start(gateway, broker.url);
  const users = {
    operator: await signInAs(gateway, 'operator'),
    engineer: await signInAs(gateway, 'engineer'),
    reviewer: await signInAs(gateway, 'reviewer'),
    engineer2: await account(gateway, 'tamsin.oake', ['engineer']),
    // one person holding both roles: the two-person rule must still keep them off their own order
    dual: await account(gateway, 'rowan.vell', ['operator', 'engineer']),
  };
  await stepUp(gateway, users.engineer);
  await stepUp(gateway, users.dual);
  await field.report();
  return {
    broker,
    gateway,
    field,
    users,
    close: async () => {
      await field.stop();
      await gateway.close();
      await broker.stop();
    },
  };
}

export const oneGate = (
  control: string,
  target: number,
  reason = 'draw down ahead of the forecast peak',
): CreateOrderRequest => ({
  steps: [{ offsetMin: 0, targets: [{ control, target }] }],
  reason,
});

export async function draft(
  world: OrdersWorld,
  body: CreateOrderRequest,
  by: SignedInUser = world.users.operator,
): Promise<Order> {
  const res = await api(world, by).post(`/reservoirs/${RES}/orders`, body);
  if (res.status !== 201)
    throw new Error(`draft refused: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as Order;
}

export async function authorised(world: OrdersWorld, body: CreateOrderRequest): Promise<Order> {
  const order = await draft(world, body);
  const res = await api(world, world.users.engineer).post(`/orders/${order.id}/authorise`, {
    comment: 'checked against the forecast',
  });
  if (res.status !== 200)
    throw new Error(`authorise refused: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as Order;
}

export const sweep = (world: OrdersWorld, wallNow?: number) =>
  world.gateway.app.get(OrderTicker).sweep(wallNow);

/** The logbook entries about an order, oldest first. */
export async function entriesOf(world: OrdersWorld, orderId: number) {
  const out = [];
  for await (const page of world.gateway.app.get(LogbookQueryService).inOrder({}))
    out.push(...page.filter((e) => e.payload.orderId === orderId));
  return out;
}
