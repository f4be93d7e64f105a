import request from 'supertest';
import { ACCESS_TEST_ENV, demoCredentials } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

const signIn = (g: TestGateway, username: string, password: string) =>
  request(g.url).post('/api/auth/sign-in').send({ username, password });

/** Everything an answer says, except the wait it names (which grows with each failure). */
const shape = (res: request.Response) => ({
  status: res.status,
  body: { ...res.body, retryAfterS: res.body.retryAfterS === undefined ? undefined : 'n' },
  retryAfter: res.headers['retry-after'] === undefined ? undefined : 'n',
  cookie: res.headers['set-cookie'],
});

let broker: TestBroker;
beforeAll(async () => {
  broker = await startTestBroker();
});
afterAll(() => broker?.stop());

describe('brute force: per-account delay that does not tell who exists', () => {
  let gateway: TestGateway;

  beforeAll(async () => {
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      SIGN_IN_FREE_FAILURES: '5',
      // a first wait far longer than the test, so "still waiting" does not depend on timing
      SIGN_IN_FIRST_DELAY_S: '600',
    });
  });
  afterAll(() => gateway?.close());

  it('answers a wrong password and an unknown user alike, then makes both wait after 5 failures', async () => {
    const operator = demoCredentials(gateway, 'operator');
    const known: request.Response[] = [];
    const unknown: request.Response[] = [];
    for (let i = 0; i < 5; i++) {
      known.push(await signIn(gateway, 'operator', `wrong-guess-${i}`));
      unknown.push(await signIn(gateway, 'no-such-person', `wrong-guess-${i}`));
    }
    for (let i = 0; i < 5; i++) expect(shape(known[i]!)).toEqual(shape(unknown[i]!));
    expect(known[0]!.status).toBe(401);
    expect(known[0]!.body.code).toBe('invalid-credentials');

    // the sixth try is refused before the password is looked at: even the right one
    const blocked = await signIn(gateway, 'operator', operator.password);
    const blockedUnknown = await signIn(gateway, 'no-such-person', 'anything');
    expect(shape(blocked)).toEqual(shape(blockedUnknown));
    expect(blocked.status).toBe(429);
    expect(blocked.body.code).toBe('too-many-attempts');
    expect(blocked.body.retryAfterS).toBeGreaterThan(500);
    expect(Number(blocked.headers['retry-after'])).toBe(blocked.body.retryAfterS);

    // other accounts are not held up; the same name in other case or spacing is the same account
    await signIn(gateway, 'engineer', demoCredentials(gateway, 'engineer').password).expect(200);
    expect((await signIn(gateway, '  OPERATOR ', operator.password)).status).toBe(429);
  });
});

describe('brute force: per-address throttle on the sign-in route', () => {
  let gateway: TestGateway;

  beforeAll(async () => {
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      SIGN_IN_RATE_PER_MIN: '8',
    });
  });
  afterAll(() => gateway?.close());

  it('stops an address after 8 attempts a minute, whichever usernames it tries', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 8; i++)
      statuses.push((await signIn(gateway, `guess-${i}`, 'hunter22')).status);
    expect(statuses).toEqual(Array(8).fill(401));
    const stopped = await signIn(gateway, 'admin', demoCredentials(gateway, 'admin').password);
    expect(stopped.status).toBe(429);
    expect(stopped.body.code).toBe('too-many-requests');
    expect(Number(stopped.headers['retry-after'])).toBeGreaterThan(0);
    // the throttle is on the password routes only: the rest of the API still answers
    await request(gateway.url)
      .get('/api/health')
      .expect((r) => expect(r.status).not.toBe(429));
  });
});
