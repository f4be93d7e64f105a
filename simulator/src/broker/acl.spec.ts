import { connectAsync, type IClientOptions, type MqttClient } from 'mqtt';
import { afterEach, describe, expect, it } from 'vitest';
import {
  brokerAccounts,
  CLOCK_CLIENT_ID,
  clockCredentials,
  deviceClientId,
  deviceCredentials,
  type SimulatorCredentials,
} from './accounts.js';
import { aclPolicy, covers, mayPublish, maySubscribe } from './acl.js';
import { startBroker, type RunningBroker } from './broker.js';

const RES = 'lake-orrin';
const CREDS: SimulatorCredentials = {
  gateway: { username: 'stillwell-gateway', password: 'test-gateway-password' },
  deviceSecret: 'test-device-secret',
};
const DEVICES = ['pool-radar', 'inflow-gauge', 'gate-controller'];
const T = (kind: string, device?: string) =>
  `stillwell/v1/${RES}/${kind}${device ? `/${device}` : ''}`;

const open: Array<MqttClient | RunningBroker> = [];
afterEach(async () => {
  for (const o of open.splice(0).reverse()) await ('endAsync' in o ? o.endAsync(true) : o.close());
});

async function securedBroker() {
  const log: string[] = [];
  const broker = await startBroker({
    port: 0,
    policy: aclPolicy(brokerAccounts(CREDS, RES, DEVICES), (l) => log.push(l)),
  });
  open.push(broker);
  const connect = async (options: IClientOptions) => {
    const c = await connectAsync(`mqtt://127.0.0.1:${broker.port}`, {
      reconnectPeriod: 0,
      ...options,
    });
    open.push(c);
    return c;
  };
  const device = (id: string) =>
    connect({ clientId: deviceClientId(id), ...deviceCredentials(CREDS, RES, id) });
  const gateway = () => connect({ clientId: 'stillwell-gateway-test', ...CREDS.gateway });
  return { broker, log, connect, device, gateway };
}

/** Records what a client receives; `next` resolves with the first message on a topic. */
function recorder(client: MqttClient) {
  const got: Array<{ topic: string; payload: string }> = [];
  const waiters: Array<{ topic: string; resolve: (p: string) => void }> = [];
  client.on('message', (topic, payload) => {
    got.push({ topic, payload: payload.toString() });
    for (const w of waiters.filter((x) => x.topic === topic)) w.resolve(payload.toString());
  });
  const next = (topic: string) =>
    new Promise<string>((resolve) => {
      const seen = got.find((g) => g.topic === topic);
      if (seen) resolve(seen.payload);
      else waiters.push({ topic, resolve });
    });
  return { got, next };
}
const closedBy = (c: MqttClient) =>
  new Promise<void>((resolve) => c.once('close', () => resolve()));

describe('the broker ACL (real aedes, real mqtt.js clients)', () => {
  it('refuses anonymous clients, wrong passwords and a device on another client id', async () => {
    const { connect, log } = await securedBroker();
    await expect(connect({ clientId: 'anon' })).rejects.toThrow(/Bad username or password/);
    await expect(
      connect({
        clientId: deviceClientId('pool-radar'),
        username: 'pool-radar',
        password: 'guess',
      }),
    ).rejects.toThrow();
    // the right password, but the gateway's client id: a session takeover attempt
    await expect(
      connect({
        clientId: 'stillwell-gateway-test',
        ...deviceCredentials(CREDS, RES, 'pool-radar'),
      }),
    ).rejects.toThrow();
    // and the gateway may not take a device's client id either
    await expect(
      connect({ clientId: deviceClientId('pool-radar'), ...CREDS.gateway }),
    ).rejects.toThrow();
    expect(log.filter((l) => l.includes('refused connection'))).toHaveLength(4);
  });

  it("delivers a device's own telemetry, and never a publish to another device's topic", async () => {
    const { device, gateway, log } = await securedBroker();
    const gw = await gateway();
    await gw.subscribeAsync('stillwell/v1/+/telemetry/+', { qos: 1 });
    const seen = recorder(gw);
    const radar = await device('pool-radar');
    const inflow = await device('inflow-gauge');

    await radar.publishAsync(T('telemetry', 'pool-radar'), 'own', { qos: 1 });
    expect(await seen.next(T('telemetry', 'pool-radar'))).toBe('own');

    // the radar posing as the inflow gauge: the broker closes it (silently, as MQTT 3.1.1 must)
    const gone = closedBy(radar);
    radar.publish(T('telemetry', 'inflow-gauge'), 'forged', { qos: 1 });
    await gone;
    // a later message from the real inflow gauge arrives; the forged one never did
    await inflow.publishAsync(T('telemetry', 'inflow-gauge'), 'genuine', { qos: 1 });
    expect(await seen.next(T('telemetry', 'inflow-gauge'))).toBe('genuine');
    expect(seen.got.map((g) => g.payload)).toEqual(['own', 'genuine']);
    expect(log).toContain(
      `broker: refused publish by "pool-radar" to ${T('telemetry', 'inflow-gauge')}; aedes closes its connection`,
    );
  });

  it('lets only the gateway command the gate controller', async () => {
    const { device, gateway, log } = await securedBroker();
    const controller = await device('gate-controller');
    await controller.subscribeAsync(T('command', 'gate-controller'), { qos: 1 });
    const commands = recorder(controller);

    const radar = await device('pool-radar');
    const gone = closedBy(radar);
    radar.publish(T('command', 'gate-controller'), '{"commandId":"rogue","gates":{"gate-1":9}}', {
      qos: 1,
    });
    await gone;

    const gw = await gateway();
    await gw.publishAsync(T('command', 'gate-controller'), '{"commandId":"order-1"}', { qos: 1 });
    expect(await commands.next(T('command', 'gate-controller'))).toBe('{"commandId":"order-1"}');
    expect(commands.got).toHaveLength(1);
    expect(log.some((l) => l.includes('refused publish by "pool-radar"'))).toBe(true);
  });

  it("refuses a device's subscription to another device's commands and the gateway's to everything", async () => {
    const { device, gateway, log } = await securedBroker();
    const radar = await device('pool-radar');
    await expect(radar.subscribeAsync(T('command', 'gate-controller'), { qos: 1 })).rejects.toThrow(
      /Subscribe error/,
    );
    await expect(radar.subscribeAsync('stillwell/v1/#', { qos: 1 })).rejects.toThrow(
      /Subscribe error/,
    );
    const [own] = await radar.subscribeAsync(T('command', 'pool-radar'), { qos: 1 });
    expect(own?.qos).toBe(1);
    const gw = await gateway();
    await expect(gw.subscribeAsync('#', { qos: 1 })).rejects.toThrow(/Subscribe error/);
    await expect(gw.subscribeAsync('stillwell/v1/+/command/+', { qos: 1 })).rejects.toThrow(
      /Subscribe error/,
    );
    for (const f of [
      'stillwell/v1/+/telemetry/+',
      'stillwell/v1/+/ack/+',
      'stillwell/v1/+/clock',
    ]) {
      const [granted] = await gw.subscribeAsync(f, { qos: 1 });
      expect(granted?.qos).toBe(1);
    }
    expect(radar.connected && gw.connected).toBe(true);
    expect(log.filter((l) => l.includes('refused subscription'))).toHaveLength(4);
  });

  it('lets the plant clock publish the clock topic and nothing else', async () => {
    const { connect, gateway } = await securedBroker();
    const gw = await gateway();
    await gw.subscribeAsync('stillwell/v1/+/clock', { qos: 1 });
    const seen = recorder(gw);
    const clock = await connect({ clientId: CLOCK_CLIENT_ID, ...clockCredentials(CREDS, RES) });
    await clock.publishAsync(T('clock'), '{"siteTime":"2030-01-01T06:00:00Z","speed":360}', {
      qos: 1,
      retain: true,
    });
    expect(await seen.next(T('clock'))).toMatch(/siteTime/);
    const gone = closedBy(clock);
    clock.publish(T('telemetry', 'pool-radar'), 'x', { qos: 1 });
    await gone;
  });
});

describe('the ACL rules as data', () => {
  const [gw, radar] = brokerAccounts(CREDS, RES, ['pool-radar']);
  it('covers a filter only when every topic it matches is allowed', () => {
    expect(covers('stillwell/v1/+/telemetry/+', 'stillwell/v1/lake-orrin/telemetry/+')).toBe(true);
    expect(covers('stillwell/v1/+/telemetry/+', 'stillwell/v1/#')).toBe(false);
    expect(
      covers('stillwell/v1/lake-orrin/command/pool-radar', 'stillwell/v1/+/command/pool-radar'),
    ).toBe(false);
    expect(covers('stillwell/v1/+/clock', 'stillwell/v1/lake-orrin/clock/x')).toBe(false);
  });
  it('binds a device to its reservoir as well as its id', () => {
    expect(mayPublish(radar!, T('telemetry', 'pool-radar'))).toBe(true);
    expect(mayPublish(radar!, 'stillwell/v1/other-lake/telemetry/pool-radar')).toBe(false);
    expect(mayPublish(radar!, T('ack', 'pool-radar'))).toBe(true);
    expect(mayPublish(gw!, T('telemetry', 'pool-radar'))).toBe(false);
    expect(mayPublish(gw!, T('rules', 'gate-controller'))).toBe(true);
    expect(maySubscribe(radar!, T('rules', 'pool-radar'))).toBe(true);
    expect(maySubscribe(gw!, 'stillwell/v1/+/rule-events/+')).toBe(true);
  });
  it('lets only the gateway ask a device for a backfill, and only that device answer', () => {
    expect(mayPublish(gw!, T('backfill', 'pool-radar'))).toBe(true);
    expect(mayPublish(radar!, T('backfill', 'pool-radar'))).toBe(false);
    expect(maySubscribe(radar!, T('backfill', 'pool-radar'))).toBe(true);
    expect(maySubscribe(radar!, T('backfill', 'inflow-gauge'))).toBe(false);
    expect(mayPublish(radar!, T('backfill-reply', 'pool-radar'))).toBe(true);
    expect(mayPublish(radar!, T('backfill-reply', 'inflow-gauge'))).toBe(false);
    expect(maySubscribe(gw!, 'stillwell/v1/+/backfill-reply/+')).toBe(true);
  });
});
