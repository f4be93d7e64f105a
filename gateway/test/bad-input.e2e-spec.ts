import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { apiErrorSchema } from '@stillwell/shared/http';
import { ACCESS_TEST_ENV, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';
import { snapshot } from './fuzz-snapshot';

const RES = 'lake-orrin';
const WHAT_IF = `/api/reservoirs/${RES}/forecasts/what-if`;
const ZONES = `/api/reservoirs/${RES}/zones`;
const STORAGE = `/api/reservoirs/${RES}/definition/storage-table`;
const IMPORT = `/api/reservoirs/${RES}/contacts/import`;

/** The refusal's reason as one line, after checking it is the gateway's error shape. */
function reasonOf(res: request.Response): string {
  const parsed = apiErrorSchema.safeParse(res.body);
  if (!parsed.success) throw new Error(`not an API error (${res.status}): ${res.text}`);
  return ([] as string[]).concat(parsed.data.message).join(' | ');
}

describe('bad input over HTTP: refused plainly, with a reason, and nothing stored changes', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let admin: SignedInUser;
  let liaison: SignedInUser;
  let before: Record<string, string>;
  const post = (user: SignedInUser, url: string) =>
    request(gateway.url).post(url).set('Authorization', `Bearer ${user.token}`);

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    admin = await signInAs(gateway, 'admin');
    await stepUp(gateway, admin);
    liaison = await signInAs(gateway, 'liaison');
    before = snapshot(gateway.databasePath);
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  afterEach(() => expect(snapshot(gateway.databasePath)).toEqual(before));

  it('refuses a body over the 1 MB limit with 413, naming the limit', async () => {
    const big = JSON.stringify({ csv: 'x'.repeat(1_200_000) });
    const res = await post(admin, STORAGE).set('Content-Type', 'application/json').send(big);
    expect(res.status).toBe(413);
    expect(reasonOf(res)).toMatch(/over the limit of 1 MB/);
  });

  it('refuses a small gzip body that inflates past the limit (a compression bomb) with 413', async () => {
    const bomb = gzipSync(Buffer.from(JSON.stringify({ csv: ' '.repeat(20_000_000) })));
    expect(bomb.length).toBeLessThan(100_000);
    const res = await fetch(`${gateway.url}${STORAGE}`, {
      method: 'POST',
      headers: {
        Authorization: `Bearer ${admin.token}`,
        'Content-Type': 'application/json',
        'Content-Encoding': 'gzip',
      },
      body: bomb,
    });
    expect(res.status).toBe(413);
    const body: unknown = await res.json();
    expect(apiErrorSchema.parse(body).message).toMatch(/over the limit of 1 MB/);
  });

  it.each([
    ['arrays', (n: number) => '['.repeat(n) + ']'.repeat(n)],
    ['objects', (n: number) => '{"a":'.repeat(n) + '1' + '}'.repeat(n)],
  ])(
    'refuses JSON nested too deep (%s, a nesting bomb) with 400, for every kind of route',
    async (_k, bomb) => {
      for (const url of [WHAT_IF, ZONES, STORAGE]) {
        const res = await post(admin, url)
          .set('Content-Type', 'application/json')
          .send(`{"x":${bomb(100_000)}}`);
        expect([url, res.status]).toEqual([url, 400]);
        expect(reasonOf(res)).toMatch(/nested deeper than 64 levels/);
      }
    },
  );

  it('refuses JSON that does not parse with 400, saying so (RFC 8259)', async () => {
    const res = await post(admin, ZONES).set('Content-Type', 'application/json').send('{"name": ');
    expect(res.status).toBe(400);
    expect(reasonOf(res)).toMatch(/not valid JSON/);
  });

  it.each([
    ['text/plain', '{"csv":"elevation,area,storage"}'],
    ['application/xml', '<csv>elevation,area,storage</csv>'],
    ['text/csv', 'elevation,area,storage\n171,0,0'],
    ['application/octet-stream', '\u0000\u0001binary'],
  ])('refuses a %s body to a JSON route with 415, naming what it takes', async (type, body) => {
    const res = await post(admin, STORAGE).set('Content-Type', type).send(body);
    expect(res.status).toBe(415);
    expect(reasonOf(res)).toMatch(/application\/json/);
    expect(reasonOf(res)).toContain(type);
  });

  it('refuses a JSON body in an unsupported charset with 415, naming it', async () => {
    const res = await post(admin, STORAGE)
      .set('Content-Type', 'application/json; charset=ebcdic')
      .send('{}');
    expect(res.status).toBe(415);
    expect(reasonOf(res)).toMatch(/ebcdic/);
  });

  it.each([
    ['', /storageTable|csv/],
    ['elevation,area,storage\n', /storageTable/],
    ['height,area,volume\n171,0,0\n175,1,2', /no column 'elevation'/],
    ['elevation,area,storage\n171,0,0\n"175,1,2\n180,3,4', /storageTable/],
    ['elevation,area,storage\n171,0,0\n173,\u0000,8000', /row 2 \(area\)/],
    ['elevation,area,storage\n171;0;0\n173;1;2', /storageTable/],
    ['\u00ff\u00fe\u0000e\u0000l\u0000e', /storageTable/],
    ['elevation,area,storage\n171,0,0\n' + '173,1,2\n'.repeat(6000), /storageTable/],
  ])('refuses a malformed storage-table CSV (%#) with 400 naming where', async (csv, reason) => {
    const res = await post(admin, STORAGE).send({ csv });
    expect(res.status).toBe(400);
    expect(reasonOf(res)).toMatch(reason);
  });

  it.each([
    ['organisation,person\n"Hessford EM,Dana'],
    [
      'zone,organisation,person,role,email,phone,leadTimeMin\nno-such-zone,Org,P,R,not-an-email,1,x',
    ],
    ['\u0000\u0000\u0000'],
    ['a,b,c\n1,2\n3,4,5,6'],
  ])(
    'imports nothing from a malformed contacts CSV (%#), each problem naming row and column',
    async (csv) => {
      const res = await post(liaison, IMPORT).send({ csv });
      expect(res.status).toBeLessThan(500);
      if (res.status === 200) {
        expect(res.body.imported).toBe(0);
        expect(res.body.problems.length).toBeGreaterThan(0);
        for (const p of res.body.problems as Array<{ message: string }>)
          expect(p.message).toMatch(/^row \d+/);
      } else {
        expect(res.status).toBe(400);
        expect(reasonOf(res)).toMatch(/csv|row/);
      }
    },
  );
});
