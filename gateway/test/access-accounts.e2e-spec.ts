import Database from 'better-sqlite3';
import request from 'supertest';
import { totpCode } from '../src/auth/totp';
import { ACCESS_TEST_ENV, signIn, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

describe('accounts: step-up, second factor, passwords, administration', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  const as = (u: SignedInUser) => ({
    get: (p: string) => request(gateway.url).get(p).set('Authorization', `Bearer ${u.token}`),
    post: (p: string, body: object = {}) =>
      request(gateway.url).post(p).set('Authorization', `Bearer ${u.token}`).send(body),
    patch: (p: string, body: object) =>
      request(gateway.url).patch(p).set('Authorization', `Bearer ${u.token}`).send(body),
    del: (p: string) => request(gateway.url).delete(p).set('Authorization', `Bearer ${u.token}`),
  });
  const logbook = () => {
    const db = new Database(gateway.databasePath, { readonly: true });
    try {
      return db
        .prepare(`SELECT kind, actor_name AS actor, payload FROM logbook_entries ORDER BY seq`)
        .all() as Array<{
        kind: string;
        actor: string | null;
        payload: string;
      }>;
    } finally {
      db.close();
    }
  };
  const db = () => new Database(gateway.databasePath);

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
  });
  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it('asks for a step-up before an administrator changes a user, and only for 5 minutes', async () => {
    const admin = await signInAs(gateway, 'admin');
    const reviewer = await signInAs(gateway, 'reviewer');
    const change = () =>
      as(admin).patch(`/api/users/${reviewer.me.id}`, { displayName: 'Odile Brandt (reviewer)' });
    expect((await change()).body).toMatchObject({ statusCode: 403, code: 'step-up-required' });
    expect((await as(admin).get('/api/auth/me')).body.stepUpUntil).toBeNull();

    const wrong = await as(admin).post('/api/auth/step-up', { password: 'not-it' });
    expect([wrong.status, wrong.body.code]).toEqual([403, 'wrong-password']);
    const ok = await as(admin).post('/api/auth/step-up', { password: admin.password }).expect(200);
    const until = Date.parse(ok.body.stepUpUntil as string);
    expect(until - Date.now()).toBeGreaterThan(290_000);
    expect(until - Date.now()).toBeLessThanOrEqual(300_000);
    expect((await change()).status).toBe(200);

    // six minutes later (moved in the database rather than waited for)
    const d = db();
    d.prepare(`UPDATE sessions SET stepped_up_at = ? WHERE id = ?`).run(
      Date.now() - 6 * 60_000,
      admin.me.sessionId,
    );
    d.close();
    expect((await change()).body.code).toBe('step-up-required');
    const kinds = logbook()
      .filter((e) => e.kind === 'auth.step-up')
      .map((e) => JSON.parse(e.payload).ok as boolean);
    expect(kinds).toEqual([false, true]);
  });

  it('enrols a second factor, then asks for it at sign-in and step-up, once per code', async () => {
    const engineer = await signInAs(gateway, 'engineer');
    expect((await as(engineer).post('/api/auth/totp/begin')).body.code).toBe('step-up-required');
    await stepUp(gateway, engineer);
    const begun = await as(engineer).post('/api/auth/totp/begin').expect(200);
    expect(begun.body.uri).toMatch(/^otpauth:\/\/totp\/Stillwell:engineer\?/);
    expect(begun.body.qrDataUrl).toMatch(/^data:image\/png;base64,/);
    const secret = begun.body.secret as string;
    expect((await as(engineer).post('/api/auth/totp/confirm', { code: '000000' })).body.code).toBe(
      'wrong-totp',
    );
    // the code of the previous 30-second step, so that the next sign-in can use the current one
    await as(engineer)
      .post('/api/auth/totp/confirm', { code: totpCode(secret, Date.now() - 30_000) })
      .expect(204);
    expect((await as(engineer).get('/api/auth/me')).body.totpEnabled).toBe(true);

    const withoutCode = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'engineer', password: engineer.password });
    expect([withoutCode.status, withoutCode.body.code]).toEqual([401, 'totp-required']);
    const wrongPasswordNoCode = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'engineer', password: 'nope-nope' });
    expect(wrongPasswordNoCode.body.code).toBe('invalid-credentials');
    const code = totpCode(secret, Date.now());
    const again = await signIn(gateway, 'engineer', engineer.password, code);
    const replay = await request(gateway.url)
      .post('/api/auth/sign-in')
      .send({ username: 'engineer', password: engineer.password, totp: code });
    expect([replay.status, replay.body.code]).toEqual([401, 'totp-invalid']);

    // step-up now needs the code too; removing the factor needs a step-up
    expect(
      (await as(again).post('/api/auth/step-up', { password: again.password })).body.code,
    ).toBe('wrong-totp');
    await as(again).post('/api/auth/totp/remove').expect(403);
    const next = totpCode(secret, Date.now() + 30_000);
    await as(again).post('/api/auth/step-up', { password: again.password, totp: next }).expect(200);
    await as(again).post('/api/auth/totp/remove').expect(204);
    expect((await as(again).get('/api/auth/me')).body.totpEnabled).toBe(false);
    const kinds = logbook().map((e) => e.kind);
    expect(kinds).toContain('user.totp-enrolled');
    expect(kinds).toContain('user.totp-removed');
    expect(JSON.stringify(logbook())).not.toContain(secret);
  });

  it('applies the password rules: 8 characters, 15 for administrators, no common password', async () => {
    const liaison = await signInAs(gateway, 'liaison');
    const change = (u: SignedInUser, newPassword: string) =>
      as(u).post('/api/auth/password', { currentPassword: u.password, newPassword });
    expect((await change(liaison, 'tidal')).body).toMatchObject({
      code: 'password-rejected',
      problems: ['too-short'],
    });
    expect((await change(liaison, 'baseball1')).body.problems).toEqual(['common']);
    const wrong = await as(liaison).post('/api/auth/password', {
      currentPassword: 'guess',
      newPassword: 'heron-sluice-lantern',
    });
    expect(wrong.body.code).toBe('wrong-password');

    const admin = await signInAs(gateway, 'admin');
    expect((await change(admin, 'fourteen-chars')).body.problems).toEqual(['too-short']);

    // a good one: works, the other sessions end, this one stays
    const other = await signInAs(gateway, 'liaison');
    await change(liaison, 'heron-sluice-lantern').expect(204);
    await as(liaison).get('/api/auth/me').expect(200);
    expect((await as(other).get('/api/auth/me')).body.code).toBe('session-ended');
    await signIn(gateway, 'liaison', 'heron-sluice-lantern');
    expect(
      logbook()
        .filter((e) => e.kind === 'user.password-changed')
        .at(-1)?.payload,
    ).toMatch(/"sessionsEnded":1/);
  });

  it('creates a user with a temporary password that must be changed before anything else', async () => {
    const admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    const created = await as(admin)
      .post('/api/users', {
        username: 'Wren.Ashby',
        displayName: 'Wren Ashby',
        roles: ['operator'],
      })
      .expect(201);
    expect(created.body.user).toMatchObject({
      username: 'wren.ashby',
      roles: ['operator'],
      mustChangePassword: true,
    });
    const temporary = created.body.temporaryPassword as string;
    expect(
      (
        await as(admin).post('/api/users', {
          username: 'wren.ashby',
          displayName: 'x',
          roles: ['operator'],
        })
      ).body.code,
    ).toBe('username-taken');

    const wren = await signIn(gateway, 'wren.ashby', temporary);
    expect(wren.me.mustChangePassword).toBe(true);
    expect((await as(wren).get('/api/reservoirs')).body.code).toBe('password-change-required');
    await as(wren)
      .post('/api/auth/password', {
        currentPassword: temporary,
        newPassword: 'gauge-house-at-dawn',
      })
      .expect(204);
    await as(wren).get('/api/reservoirs').expect(200);

    // reset: a new temporary password, every session ended
    const reset = await as(admin).post(`/api/users/${wren.me.id}/reset-password`, {}).expect(200);
    expect((await as(wren).get('/api/reservoirs')).body.code).toBe('session-ended');
    const back = await signIn(gateway, 'wren.ashby', reset.body.temporaryPassword as string);
    expect(back.me.mustChangePassword).toBe(true);
    const kinds = logbook().map((e) => e.kind);
    expect(kinds).toEqual(
      expect.arrayContaining([
        'user.created',
        'user.password-reset',
        'auth.sign-in',
        'auth.sign-in-failed',
      ]),
    );
    expect(JSON.stringify(logbook())).not.toContain(temporary);
  });

  it('changes roles (logged), and never leaves the gateway without an enabled administrator', async () => {
    const admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    const stakeholder = await signInAs(gateway, 'stakeholder');
    await as(admin)
      .patch(`/api/users/${stakeholder.me.id}`, { roles: ['stakeholder', 'reviewer'] })
      .expect(200);
    // the very next request sees the new roles: they come from the database, not the token
    await as(stakeholder).get('/api/reservoirs').expect(200);
    const entry = logbook()
      .filter((e) => e.kind === 'user.roles-changed')
      .at(-1)!;
    expect(entry.actor).toBe('admin');
    expect(JSON.parse(entry.payload)).toMatchObject({
      username: 'stakeholder',
      from: ['stakeholder'],
      to: ['stakeholder', 'reviewer'],
    });

    const self = admin.me.id;
    expect((await as(admin).patch(`/api/users/${self}`, { roles: ['reviewer'] })).body.code).toBe(
      'last-admin',
    );
    expect((await as(admin).patch(`/api/users/${self}`, { disabled: true })).body.code).toBe(
      'last-admin',
    );
    const bad = await as(admin).patch(`/api/users/${stakeholder.me.id}`, { roles: ['root'] });
    expect(bad.status).toBe(400);
    expect(
      (await as(admin).get('/api/users')).body.map((u: { username: string }) => u.username),
    ).toContain('stakeholder');
  });

  it("lists and ends one's own sessions, never someone else's", async () => {
    const a = await signInAs(gateway, 'operator');
    const b = await signInAs(gateway, 'operator');
    const listed = (await as(a).get('/api/auth/sessions').expect(200)).body as Array<{
      id: string;
      current: boolean;
    }>;
    expect(listed.find((s) => s.current)?.id).toBe(a.me.sessionId);
    expect(listed.map((s) => s.id)).toContain(b.me.sessionId);

    const reviewer = await signInAs(gateway, 'reviewer');
    expect((await as(reviewer).del(`/api/auth/sessions/${a.me.sessionId}`)).body.code).toBe(
      'session-not-found',
    );
    await as(a).get('/api/auth/me').expect(200);

    await as(a).del(`/api/auth/sessions/${b.me.sessionId}`).expect(204);
    expect((await as(b).get('/api/auth/me')).body.code).toBe('session-ended');
    const c = await signInAs(gateway, 'operator');
    expect((await as(a).del('/api/auth/sessions').expect(200)).body.ended).toBeGreaterThanOrEqual(
      1,
    );
    expect((await as(c).get('/api/auth/me')).status).toBe(401);
    await as(a).get('/api/auth/me').expect(200);
  });
});
