import fc from 'fast-check';
import request from 'supertest';
import { z } from 'zod';
import { ROLES, can, type Action, type Role } from '@stillwell/shared/access';
import { apiErrorSchema } from '@stillwell/shared/http';
import {
  contactInputSchema,
  importRequestSchema,
  noticeEditSchema,
  prepareRequestSchema,
  zoneInputSchema,
} from '@stillwell/shared/notices';
import { ACCESS_TEST_ENV, signInAs, stepUp, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';
import { snapshot } from './fuzz-snapshot';
import {
  invalidBodies,
  resolver,
  type BodyCase,
  type Resolve,
  type Schema,
} from './fuzz-arbitraries';

/** Cases per kind of invalid body and route: 4 kinds x ~40 routes x RUNS, a few thousand in all. */
const RUNS = Number(process.env.FUZZ_RUNS ?? 50);
const PARAMS: Record<string, string> = { id: 'lake-orrin', reservoirId: 'lake-orrin' };
const BODY_METHODS = ['post', 'put', 'patch'] as const;
/**
 * Routes whose body the API document does not describe (their pipes check shared zod schemas): the
 * same schemas as JSON Schema, so that they are fuzzed too.
 */
const UNDOCUMENTED: Record<string, z.ZodType> = {
  'post /api/reservoirs/{reservoirId}/zones': zoneInputSchema,
  'put /api/reservoirs/{reservoirId}/zones/{zoneId}': zoneInputSchema,
  'post /api/reservoirs/{reservoirId}/contacts': contactInputSchema,
  'put /api/reservoirs/{reservoirId}/contacts/{contactId}': contactInputSchema,
  'post /api/reservoirs/{reservoirId}/contacts/import': importRequestSchema,
  'post /api/reservoirs/{reservoirId}/notices/prepare': prepareRequestSchema,
  'put /api/notices/{noticeId}/wording': noticeEditSchema,
};

/** Routes that read no body at all (an action on the resource named in the path). */
const NO_BODY = new Set([
  'post /api/backups',
  'post /api/auth/refresh',
  'post /api/auth/sign-out',
  'post /api/auth/totp/begin',
  'post /api/auth/totp/remove',
  'post /api/notices/{noticeId}/send',
  'post /api/notices/mine/{recipientId}/acknowledge',
  'post /api/orders/{orderId}/execute',
]);

interface BodyRoute {
  method: (typeof BODY_METHODS)[number];
  path: string;
  url: string;
  permission?: Action;
  schema: Schema;
  /** documented as multipart/form-data (fields are strings; a list is a repeated field) */
  form: boolean;
}

interface ApiDoc {
  paths: Record<
    string,
    Partial<
      Record<
        string,
        {
          'x-permission'?: Action;
          requestBody?: { content: Record<string, { schema: Schema }> };
        }
      >
    >
  >;
  components: { schemas: Record<string, Schema> };
}

/** The routes with a body schema, and those with a body method that have neither schema nor NO_BODY. */
function bodyRoutes(doc: ApiDoc): { routes: BodyRoute[]; unfuzzed: string[] } {
  const routes: BodyRoute[] = [];
  const unfuzzed: string[] = [];
  for (const [path, item] of Object.entries(doc.paths)) {
    for (const method of BODY_METHODS) {
      const op = item[method];
      if (!op) continue;
      const content = op.requestBody?.content;
      const documented = content?.['application/json'] ?? content?.['multipart/form-data'];
      const zod = UNDOCUMENTED[`${method} ${path}`];
      const schema = documented?.schema ?? (zod ? (z.toJSONSchema(zod) as Schema) : undefined);
      if (!schema) {
        if (!NO_BODY.has(`${method} ${path}`)) unfuzzed.push(`${method} ${path}`);
        continue;
      }
      const url = path.replace(/\{(\w+)\}/g, (_m, n: string) => PARAMS[n] ?? `no-such-${n}`);
      const form = !content?.['application/json'] && Boolean(content?.['multipart/form-data']);
      routes.push({ method, path, url, permission: op['x-permission'], schema, form });
    }
  }
  return { routes, unfuzzed };
}

/** What is wrong with the answer to an invalid body, or null when it is a plain, clear refusal. */
function problemWith(res: request.Response, c: BodyCase): string | null {
  if (res.status >= 500) return `answered ${res.status}`;
  if (res.status !== 400) return `answered ${res.status}, not 400`;
  const parsed = apiErrorSchema.safeParse(res.body);
  if (!parsed.success) return `body is not an API error: ${JSON.stringify(res.body)}`;
  const text = ([] as string[]).concat(parsed.data.message).join(' | ');
  if (!text.trim() || text === 'Bad Request') return `no reason given: ${text}`;
  if (c.names && !c.names.some((n) => text.includes(n)))
    return `reason does not name ${c.names.join(' or ')}: ${text}`;
  return null;
}

describe('every API body, fuzzed (fast-check): invalid input is refused plainly and changes nothing', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let routes: BodyRoute[];
  let unfuzzed: string[];
  let resolve: Resolve;
  const users = new Map<Role, SignedInUser>();

  beforeAll(async () => {
    broker = await startTestBroker();
    // the sign-in throttle would answer 429 before the body is read: raised, so validation is what is tried
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      SIGN_IN_RATE_PER_MIN: '10000',
      MQTT_URL: broker.url,
    });
    const doc = (await request(gateway.url).get('/api/docs-json').expect(200)).body as ApiDoc;
    ({ routes, unfuzzed } = bodyRoutes(doc));
    resolve = resolver(doc.components.schemas);
    for (const role of ROLES) {
      const user = await signInAs(gateway, role);
      await stepUp(gateway, user);
      users.set(role, user);
    }
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  it('knows a body schema for every POST, PUT and PATCH route that reads a body', () => {
    expect(unfuzzed).toEqual([]);
  });

  it('sends thousands of invalid bodies to every route with a body, as a user allowed to call it', async () => {
    expect(routes.length).toBeGreaterThan(30);
    const before = snapshot(gateway.databasePath);
    const problems: string[] = [];
    let cases = 0;
    for (const route of routes) {
      const role = route.permission ? ROLES.find((r) => can([r], route.permission!)) : 'operator';
      const token = users.get(role ?? 'admin')!.token;
      for (const arbitrary of invalidBodies(route.schema, resolve, route.form)) {
        const property = fc.asyncProperty(arbitrary, async (c) => {
          cases += 1;
          const call = request(gateway.url);
          const res = await call[route.method](route.url)
            .set('Authorization', `Bearer ${token}`)
            .set('Content-Type', 'application/json')
            .send(JSON.stringify(c.body));
          const problem = problemWith(res, c);
          if (problem) throw new Error(problem);
        });
        const result = await fc.check(property, { numRuns: RUNS, seed: 9 });
        if (result.failed) {
          const c = result.counterexample?.[0] as BodyCase | undefined;
          problems.push(
            `${route.method} ${route.path} [${c?.kind}] ${JSON.stringify(c?.body).slice(0, 200)}: ${(result.errorInstance as Error | undefined)?.message}`,
          );
        }
      }
    }
    console.log(`fuzz-api: ${cases} cases on ${routes.length} routes`);
    expect(problems).toEqual([]);
    expect(cases).toBeGreaterThan(2000);
    expect(snapshot(gateway.databasePath)).toEqual(before);
  }, 600_000);
});
