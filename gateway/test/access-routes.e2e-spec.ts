import { Controller, Get, Module } from '@nestjs/common';
import request from 'supertest';
import { ACTIONS, can, ROLES, type Action, type Role } from '@stillwell/shared/access';
import { ACCESS_TEST_ENV, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

/** Path parameters that exist in the demo; anything else is answered 404, past the guard. */
const PARAMS: Record<string, string> = { id: 'lake-orrin', channel: 'pool.radar' };
const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;
/** Codes only the guard gives: a public route must never answer with one. */
const GUARD_CODES = [
  'unauthenticated',
  'token-expired',
  'token-invalid',
  'session-ended',
  'forbidden',
  'route-not-declared',
];

interface Operation {
  method: (typeof METHODS)[number];
  path: string;
  url: string;
  permission?: Action;
  isPublic: boolean;
}

async function operations(url: string): Promise<Operation[]> {
  const doc = (await request(url).get('/api/docs-json').expect(200)).body as {
    paths: Record<
      string,
      Partial<Record<string, { 'x-permission'?: Action; 'x-public'?: boolean }>>
    >;
  };
  const ops: Operation[] = [];
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const method of METHODS) {
      const op = item[method];
      if (!op) continue;
      const concrete = path.replace(
        /\{(\w+)\}/g,
        (_m, name: string) => PARAMS[name] ?? `no-such-${name}`,
      );
      ops.push({
        method,
        path,
        url: concrete,
        permission: op['x-permission'],
        isPublic: op['x-public'] === true,
      });
    }
  }
  // signing out ends the caller's session: last, so every other route is tried while signed in
  return ops.sort(
    (a, b) => Number(a.path.endsWith('/sign-out')) - Number(b.path.endsWith('/sign-out')),
  );
}

const call = (url: string, op: Operation, token?: string) => {
  const req = request(url)[op.method](op.url);
  if (token) void req.set('Authorization', `Bearer ${token}`);
  return ['post', 'put', 'patch'].includes(op.method) ? req.send({}) : req;
};

describe('every route of the API document, with every role and with none, as the permission matrix says', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let ops: Operation[];
  const users = new Map<Role, SignedInUser>();

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({ ...ACCESS_TEST_ENV, MQTT_URL: broker.url });
    ops = await operations(gateway.url);
    for (const role of ROLES) {
      const user = await signInAs(gateway, role);
      // stepped up, so that routes needing it show what the matrix alone decides
      await stepUp(gateway, user);
      users.set(role, user);
    }
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it('finds the routes, and each declares exactly one of x-permission (a known action) or x-public', () => {
    expect(ops.length).toBeGreaterThan(20);
    const undeclared = ops
      .filter((o) => Boolean(o.permission) === o.isPublic)
      .map((o) => `${o.method} ${o.path}`);
    expect(undeclared).toEqual([]);
    for (const o of ops) if (o.permission) expect(ACTIONS).toContain(o.permission);
    expect(
      ops
        .filter((o) => o.isPublic)
        .map((o) => `${o.method} ${o.path}`)
        .sort(),
    ).toEqual([
      'get /api/health',
      // downstream contacts follow their e-mailed link without an account; emergency-management
      // systems read the CAP feed without one
      'get /api/notices/ack/{token}',
      'get /api/notices/alerts/{noticeId}.xml',
      'get /api/notices/feed.json',
      'get /api/notices/feed.xml',
      'post /api/auth/refresh',
      'post /api/auth/sign-in',
    ]);
  });

  it('refuses every protected route without a token (401 unauthenticated), and lets public ones past the guard', async () => {
    for (const op of ops) {
      const res = await call(gateway.url, op);
      const where = `${op.method} ${op.path}: ${res.status} ${JSON.stringify(res.body)}`;
      if (op.isPublic) {
        expect([where, GUARD_CODES.includes(res.body?.code)]).toEqual([where, false]);
      } else {
        expect([where, res.status, res.body.code]).toEqual([where, 401, 'unauthenticated']);
      }
    }
  });

  it.each(ROLES)('allows and refuses exactly as the matrix says for %s', async (role) => {
    const { token } = users.get(role)!;
    const verdicts: string[] = [];
    const expected: string[] = [];
    for (const op of ops.filter((o) => o.permission)) {
      const res = await call(gateway.url, op, token);
      const allowed = ![401, 403].includes(res.status);
      const refused = res.status === 403 && res.body.code === 'forbidden';
      verdicts.push(
        `${op.method} ${op.path}: ${allowed ? 'allowed' : refused ? 'forbidden' : `${res.status} ${res.body.code}`}`,
      );
      expected.push(
        `${op.method} ${op.path}: ${can([role], op.permission!) ? 'allowed' : 'forbidden'}`,
      );
    }
    expect(verdicts).toEqual(expected);
  });
});

@Controller('undeclared')
class UndeclaredController {
  @Get()
  open(): string {
    return 'should never be served';
  }
}
@Module({ controllers: [UndeclaredController] })
class UndeclaredModule {}

describe('a route that declares neither a permission nor @Public()', () => {
  let gateway: TestGateway;

  beforeAll(async () => {
    gateway = await startTestGateway(
      { ...ACCESS_TEST_ENV, MQTT_URL: 'mqtt://127.0.0.1:9' },
      { imports: [UndeclaredModule] },
    );
  });
  afterAll(() => gateway?.close());

  it('is refused to everyone, the administrator included (fail closed), and stands out in the document', async () => {
    const admin = await signInAs(gateway, 'admin');
    for (const auth of [undefined, `Bearer ${admin.token}`]) {
      const req = request(gateway.url).get('/api/undeclared');
      const res = await (auth ? req.set('Authorization', auth) : req);
      expect([res.status, res.body.code]).toEqual([403, 'route-not-declared']);
    }
    const undeclared = (await operations(gateway.url)).filter((o) => !o.permission && !o.isPublic);
    expect(undeclared.map((o) => o.path)).toContain('/api/undeclared');
  });
});
