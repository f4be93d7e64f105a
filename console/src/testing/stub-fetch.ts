import { vi } from 'vitest';

export type RouteAnswer = unknown | ((url: URL) => unknown);

/**
 * Replaces fetch with answers by pathname (the API client's boundary). An unknown path answers
 * 404 the way the gateway does, so a test that asks for the wrong thing fails visibly.
 */
export function stubFetch(routes: Record<string, RouteAnswer>) {
  const calls: URL[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL) => {
    const url = new URL(
      String(input instanceof Request ? input.url : input),
      'http://console.test',
    );
    calls.push(url);
    const answer = routes[url.pathname];
    if (answer === undefined) {
      return Response.json(
        { statusCode: 404, message: `no route ${url.pathname}`, error: 'Not Found' },
        { status: 404 },
      );
    }
    const body = typeof answer === 'function' ? (answer as (u: URL) => unknown)(url) : answer;
    return body instanceof Response ? body.clone() : Response.json(body);
  });
  vi.stubGlobal('fetch', fetchStub);
  return { calls, fetchStub };
}
