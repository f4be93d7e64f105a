import request from 'supertest';
import { io, type Socket } from 'socket.io-client';
import { LIVE_AUTH_EVENTS, type LiveAuthAck } from '@stillwell/shared/access';
import { LIVE_EVENTS, LIVE_NAMESPACE } from '@stillwell/shared/telemetry';
import { ACCESS_TEST_ENV, signInAs, stepUp } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';
import { decodeJwt, forgeJwt } from './support/jwt';

const KEY = ACCESS_TEST_ENV.JWT_SECRET;

describe('the live socket: token in the handshake, closed when the token or session ends', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
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
  const connected = (s: Socket) =>
    new Promise<void>((resolve, reject) => {
      s.once('connect', () => resolve());
      s.once('connect_error', reject);
    });
  const refused = (s: Socket) =>
    new Promise<string>((resolve, reject) => {
      s.once('connect', () => reject(new Error('connected')));
      s.once('connect_error', (e) => resolve(e.message));
    });
  const closed = (s: Socket) =>
    new Promise<{ reason: string; code?: string }>((resolve) => {
      let code: string | undefined;
      s.once(LIVE_AUTH_EVENTS.expired, (m: { code: string }) => (code = m.code));
      s.once('disconnect', (reason) => resolve({ reason, code }));
    });
  /** A token signed with the gateway's key for a real session, expiring in `seconds`. */
  const shortLived = (token: string, seconds: number) => {
    const { header, payload } = decodeJwt(token);
    return forgeJwt(header, { ...payload, exp: Math.floor(Date.now() / 1000) + seconds }, KEY);
  };

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
  });
  afterAll(async () => {
    for (const s of sockets) s.close();
    await gateway?.close();
    await broker?.stop();
  });

  it('refuses a connection without a token, with a bad one, or with an expired one', async () => {
    expect(await refused(open())).toBe('unauthenticated');
    expect(await refused(open({ token: 'not-a-token' }))).toBe('token-invalid');
    const operator = await signInAs(gateway, 'operator');
    expect(await refused(open({ token: shortLived(operator.token, -5) }))).toBe('token-expired');
    const { payload } = decodeJwt(operator.token);
    expect(await refused(open({ token: forgeJwt({ alg: 'none', typ: 'JWT' }, payload) }))).toBe(
      'token-invalid',
    );
  });

  it('joins the reservoir room only with telemetry.read', async () => {
    const operator = await signInAs(gateway, 'operator');
    const ok = open({ token: operator.token });
    await connected(ok);
    expect(
      await ok.timeout(5000).emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: 'lake-orrin' }),
    ).toEqual({ ok: true });

    const stakeholder = await signInAs(gateway, 'stakeholder');
    const outsider = open({ token: stakeholder.token });
    await connected(outsider);
    let pushed = 0;
    outsider.on(LIVE_EVENTS.status, () => (pushed += 1));
    const ack = await outsider
      .timeout(5000)
      .emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: 'lake-orrin' });
    expect(ack).toEqual({ ok: false, error: 'forbidden' });
    // the operator's socket gets a status push (about every 200 ms here); the stakeholder's none
    await new Promise<void>((resolve) => ok.once(LIVE_EVENTS.status, () => resolve()));
    await new Promise<void>((resolve) => ok.once(LIVE_EVENTS.status, () => resolve()));
    expect(pushed).toBe(0);
  });

  it('closes a socket whose token expires, and keeps one that sent a fresh token in time', async () => {
    const engineer = await signInAs(gateway, 'engineer');
    // both tokens expire at the same second; one socket renews with `auth`
    const expiring = shortLived(engineer.token, 3);
    const renewing = open({ token: expiring });
    await connected(renewing);
    const lapsing = open({ token: expiring });
    await connected(lapsing);
    const ack = (await renewing
      .timeout(5000)
      .emitWithAck(LIVE_AUTH_EVENTS.auth, { token: engineer.token })) as LiveAuthAck;
    expect(ack.ok).toBe(true);
    expect(Date.parse(ack.expiresAt!)).toBeGreaterThan(Date.now() + 60_000);

    expect(await closed(lapsing)).toEqual({
      reason: 'io server disconnect',
      code: 'token-expired',
    });
    // the renewed socket's timer was for the same moment: a round trip proves it still stands
    expect(
      await renewing
        .timeout(5000)
        .emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: 'lake-orrin' }),
    ).toEqual({ ok: true });
    expect(renewing.connected).toBe(true);
  });

  it("refuses another user's token on an open socket", async () => {
    const reviewer = await signInAs(gateway, 'reviewer');
    const liaison = await signInAs(gateway, 'liaison');
    const s = open({ token: reviewer.token });
    await connected(s);
    expect(
      await s.timeout(5000).emitWithAck(LIVE_AUTH_EVENTS.auth, { token: liaison.token }),
    ).toEqual({ ok: false, error: 'forbidden' });
    expect(await s.timeout(5000).emitWithAck(LIVE_AUTH_EVENTS.auth, { token: 'x' })).toEqual({
      ok: false,
      error: 'token-invalid',
    });
  });

  it('closes the sockets of a session that signs out, and of a user an administrator disables', async () => {
    const operator = await signInAs(gateway, 'operator');
    const s = open({ token: operator.token });
    await connected(s);
    const gone = closed(s);
    await request(gateway.url)
      .post('/api/auth/sign-out')
      .set('Authorization', `Bearer ${operator.token}`)
      .expect(204);
    expect(await gone).toEqual({ reason: 'io server disconnect', code: 'session-ended' });

    const liaison = await signInAs(gateway, 'liaison');
    const t = open({ token: liaison.token });
    await connected(t);
    const admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    const dropped = closed(t);
    await request(gateway.url)
      .patch(`/api/users/${liaison.me.id}`)
      .set('Authorization', `Bearer ${admin.token}`)
      .send({ disabled: true })
      .expect(200);
    expect(await dropped).toEqual({ reason: 'io server disconnect', code: 'session-ended' });
    expect(await refused(open({ token: liaison.token }))).toBe('session-ended');
  });
});
