import Database from 'better-sqlite3';
import request from 'supertest';
import { ACCESS_TEST_ENV, refreshCookieOf, signInAs, stepUp } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';
import { decodeJwt, forgeJwt } from './support/jwt';

const KEY = ACCESS_TEST_ENV.JWT_SECRET;
const STATUS = '/api/reservoirs/lake-orrin/status';

describe('attacks on sign-in and tokens', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  const get = (path: string, token: string) =>
    request(gateway.url).get(path).set('Authorization', `Bearer ${token}`);
  const kinds = () => {
    const db = new Database(gateway.databasePath, { readonly: true });
    try {
      return (
        db.prepare(`SELECT kind, payload FROM logbook_entries ORDER BY seq`).all() as Array<{
          kind: string;
          payload: string;
        }>
      ).map((r) => ({ kind: r.kind, payload: JSON.parse(r.payload) as Record<string, unknown> }));
    } finally {
      db.close();
    }
  };

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
  });
  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it('refuses no token, a malformed header, and a token of another scheme', async () => {
    expect((await request(gateway.url).get(STATUS)).body.code).toBe('unauthenticated');
    expect((await request(gateway.url).get(STATUS).set('Authorization', 'Bearer')).status).toBe(
      401,
    );
    expect(
      (await request(gateway.url).get(STATUS).set('Authorization', 'Basic b3BlcmF0b3I6eA=='))
        .status,
    ).toBe(401);
    expect((await get(STATUS, 'not.a.jwt')).body.code).toBe('token-invalid');
  });

  it('refuses an expired token, a tampered one, alg none, another key and another audience', async () => {
    const operator = await signInAs(gateway, 'operator');
    await get(STATUS, operator.token).expect(200);
    const { header, payload } = decodeJwt(operator.token);
    expect(header.alg).toBe('HS256');
    const now = Math.floor(Date.now() / 1000);

    const expired = forgeJwt(header, { ...payload, iat: now - 1000, exp: now - 10 }, KEY);
    expect((await get(STATUS, expired)).body).toMatchObject({
      statusCode: 401,
      code: 'token-expired',
    });

    // the payload changed (to the administrator's id), the signature kept
    const admin = await signInAs(gateway, 'admin');
    const [, adminPayload] = admin.token.split('.');
    const [h, p, sig] = operator.token.split('.');
    expect((await get(STATUS, `${h}.${adminPayload}.${sig}`)).body.code).toBe('token-invalid');
    // one character of the signature changed
    const flipped = sig!.slice(0, -2) + (sig!.at(-2) === 'A' ? 'B' : 'A') + sig!.at(-1);
    expect((await get(STATUS, `${h}.${p}.${flipped}`)).status).toBe(401);

    const none = forgeJwt({ alg: 'none', typ: 'JWT' }, payload);
    expect((await get(STATUS, none)).body.code).toBe('token-invalid');
    const noneUpper = forgeJwt({ alg: 'NONE', typ: 'JWT' }, payload);
    expect((await get(STATUS, noneUpper)).status).toBe(401);
    expect(
      (await get(STATUS, forgeJwt(header, payload, 'some-other-key-of-at-least-32-characters!')))
        .status,
    ).toBe(401);
    expect(
      (await get(STATUS, forgeJwt(header, { ...payload, aud: 'someone-else' }, KEY))).status,
    ).toBe(401);
    // a well-signed token for a session that does not exist (the key alone is not enough)
    expect(
      (await get(STATUS, forgeJwt(header, { ...payload, sid: 'made-up' }, KEY))).body.code,
    ).toBe('session-ended');
  });

  it('gives no role that was smuggled into a request body', async () => {
    const res = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'stakeholder', password: 'whatever', roles: ['admin'] })
      .expect(400);
    expect(JSON.stringify(res.body.message)).toMatch(/roles should not exist/);

    const stakeholder = await signInAs(gateway, 'stakeholder');
    const patch = await request(gateway.url)
      .patch('/api/auth/me')
      .set('Authorization', `Bearer ${stakeholder.token}`)
      .send({ displayName: 'Dorran Pike', roles: ['admin'], permissions: ['users.manage'] })
      .expect(400);
    expect(JSON.stringify(patch.body.message)).toMatch(/roles should not exist/);
    const me = await get('/api/auth/me', stakeholder.token).expect(200);
    expect(me.body.roles).toEqual(['stakeholder']);
    expect((await get('/api/users', stakeholder.token)).body.code).toBe('forbidden');
    // an extra claim in a token signed with the real key changes nothing either: roles come from the database
    const { header, payload } = decodeJwt(stakeholder.token);
    const claimed = forgeJwt(header, { ...payload, roles: ['admin'] }, KEY);
    expect((await get('/api/users', claimed)).body.code).toBe('forbidden');
  });

  it("refuses a disabled user's still-valid token and refresh at once", async () => {
    const liaison = await signInAs(gateway, 'liaison');
    await get(STATUS, liaison.token).expect(200);
    const admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    await request(gateway.url)
      .patch(`/api/users/${liaison.me.id}`)
      .set('Authorization', `Bearer ${admin.token}`)
      .send({ disabled: true })
      .expect(200);
    expect((await get(STATUS, liaison.token)).body).toMatchObject({
      statusCode: 401,
      code: 'session-ended',
    });
    await request(gateway.url).post('/api/auth/refresh').set('Cookie', liaison.cookie).expect(401);
    // and signing in again says what a wrong password says
    const again = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: liaison.username, password: liaison.password })
      .expect(401);
    expect(again.body.code).toBe('invalid-credentials');
    expect(
      kinds()
        .filter((k) => k.kind === 'user.disabled')
        .at(-1)?.payload,
    ).toMatchObject({ username: 'liaison', sessionsEnded: 1 });
    await request(gateway.url)
      .patch(`/api/users/${liaison.me.id}`)
      .set('Authorization', `Bearer ${admin.token}`)
      .send({ disabled: false })
      .expect(200);
  });

  it('rotates the refresh token, and a reused one ends the whole family (logged)', async () => {
    const reviewer = await signInAs(gateway, 'reviewer');
    const first = await request(gateway.url)
      .post('/api/auth/refresh')
      .set('Cookie', reviewer.cookie)
      .expect(200);
    const second = refreshCookieOf(first);
    expect(second).not.toBe(reviewer.cookie);
    await get(STATUS, first.body.accessToken as string).expect(200);

    // the first cookie again: a copy was taken; the family ends
    const reuse = await request(gateway.url)
      .post('/api/auth/refresh')
      .set('Cookie', reviewer.cookie)
      .expect(401);
    expect(reuse.body.code).toBe('refresh-invalid');
    await request(gateway.url).post('/api/auth/refresh').set('Cookie', second).expect(401);
    expect((await get(STATUS, first.body.accessToken as string)).body.code).toBe('session-ended');
    expect((await get(STATUS, reviewer.token)).body.code).toBe('session-ended');
    const reused = kinds().filter((k) => k.kind === 'auth.refresh-reuse');
    expect(reused.at(-1)?.payload.sessionId).toBe(reviewer.me.sessionId);
    // nothing secret went into the logbook
    const all = JSON.stringify(kinds());
    expect(all).not.toContain(reviewer.password);
    expect(all).not.toContain(reviewer.cookie.split('=')[1]);
  });

  it('sets the refresh cookie httpOnly, SameSite=Strict, on /api/auth only, and refuses a foreign origin', async () => {
    const res = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'engineer', password: (await signInAs(gateway, 'engineer')).password })
      .expect(200);
    const raw = (res.headers['set-cookie'] as unknown as string[])[0]!;
    expect(raw).toMatch(/HttpOnly/);
    expect(raw).toMatch(/SameSite=Strict/);
    expect(raw).toMatch(/Path=\/api\/auth/);
    const cookie = refreshCookieOf(res);
    const foreign = await request(gateway.url)
      .post('/api/auth/refresh')
      .set('Cookie', cookie)
      .set('Origin', 'https://evil.example')
      .expect(403);
    expect(foreign.body.code).toBe('origin-refused');
    await request(gateway.url)
      .post('/api/auth/refresh')
      .set('Cookie', cookie)
      .set('Origin', 'http://localhost:5173')
      .expect(200);
  });

  it('ends the session at sign-out', async () => {
    const operator = await signInAs(gateway, 'operator');
    await request(gateway.url)
      .post('/api/auth/sign-out')
      .set('Authorization', `Bearer ${operator.token}`)
      .expect(204);
    expect((await get(STATUS, operator.token)).body.code).toBe('session-ended');
    await request(gateway.url).post('/api/auth/refresh').set('Cookie', operator.cookie).expect(401);
  });

  it('sends the hardening headers: CSP self only, no sniffing, no framing; CORS only for the console', async () => {
    const res = await request(gateway.url)
      .get('/api/health')
      .set('Origin', 'http://localhost:5173');
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toMatch(/default-src 'self'/);
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['access-control-allow-origin']).toBe('http://localhost:5173');
    const foreign = await request(gateway.url)
      .get('/api/health')
      .set('Origin', 'https://evil.example');
    expect(foreign.headers['access-control-allow-origin']).toBeUndefined();
    // a body over 1 MB is refused before anything reads it
    const big = await request(gateway.url)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ username: 'x', password: 'y'.repeat(1_100_000) }));
    expect(big.status).toBe(413);
  });
});
