import { vi } from 'vitest';
import type { Me } from '@stillwell/shared/access';
import type { Emergency, Order } from '@stillwell/shared/orders';
import { definition, SITE_NOW } from './fixtures';

const iso = (ms: number) => new Date(ms).toISOString();

export const people = {
  operator: { userId: 'u-op', username: 'operator' },
  engineer: { userId: 'u-eng', username: 'engineer' },
};

export function makeMe(role: 'operator' | 'engineer', over: Partial<Me> = {}): Me {
  const permissions: Me['permissions'] =
    role === 'operator'
      ? [
          'orders.read',
          'orders.draft',
          'orders.execute',
          'emergency.declare',
          'logbook.read',
          'logbook.write',
          'logbook.verify',
        ]
      : [
          'orders.read',
          'orders.authorise',
          'orders.countersign',
          'emergency.declare',
          'automation.edit',
          'logbook.read',
          'logbook.write',
          'logbook.verify',
        ];
  return {
    id: people[role].userId,
    username: role,
    displayName: role,
    roles: [role],
    permissions,
    sessionId: 's1',
    stepUpUntil: null,
    totpEnabled: false,
    mustChangePassword: false,
    ...over,
  };
}

export function makeOrder(over: Partial<Order> = {}): Order {
  return {
    id: 12,
    reservoirId: definition.id,
    state: 'proposed',
    emergency: false,
    emergencyId: null,
    steps: [{ offsetMin: 0, targets: [{ control: 'gate-2', target: 3 }] }],
    reason: 'draw the pool down ahead of the forecast peak',
    plannedStart: iso(SITE_NOW),
    author: people.operator,
    createdAt: iso(SITE_NOW - 60_000),
    forecast: null,
    impact: null,
    decision: null,
    authorisedUntil: null,
    execution: null,
    currentStep: null,
    nextStepDue: null,
    commands: [],
    fault: null,
    awaitingCountersign: false,
    countersign: null,
    withdrawal: null,
    updatedAt: iso(SITE_NOW - 60_000),
    ...over,
  };
}

export const anEmergency: Emergency = {
  id: 1,
  reservoirId: definition.id,
  level: 2,
  reason: 'inflow far above the forecast',
  declaredBy: people.engineer,
  declaredAt: iso(SITE_NOW - 600_000),
  ended: null,
};

export interface Call {
  method: string;
  path: string;
  body: unknown;
}

/**
 * fetch by method and path, recording each call (body parsed), so a test can answer a POST
 * differently the second time (a step-up, then the retry).
 */
export function stubApi(routes: Record<string, unknown | ((call: Call, n: number) => unknown)>) {
  const calls: Call[] = [];
  const counts = new Map<string, number>();
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(
        String(input instanceof Request ? input.url : input),
        'http://console.test',
      );
      const method = init?.method ?? 'GET';
      const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : init?.body;
      const call = { method, path: url.pathname, body };
      calls.push(call);
      const key = `${method} ${url.pathname}`;
      const n = (counts.get(key) ?? 0) + 1;
      counts.set(key, n);
      const answer = routes[key];
      if (answer === undefined)
        return Response.json({ statusCode: 404, message: `no route ${key}` }, { status: 404 });
      const value =
        typeof answer === 'function'
          ? (answer as (c: Call, n: number) => unknown)(call, n)
          : answer;
      return value instanceof Response ? value : Response.json(value);
    }),
  );
  return calls;
}
