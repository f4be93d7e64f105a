import { tokenResponseSchema, type TokenResponse } from '@stillwell/shared/access';
import { env } from '../config/env';

/**
 * The signed-in session: the short-lived access token in memory only (never in storage), renewed
 * through the httpOnly refresh cookie. Every request and the live socket take their token here.
 */
let current: TokenResponse | null = null;
const listeners = new Set<(s: TokenResponse | null) => void>();

export function session(): TokenResponse | null {
  return current;
}

/**
 * True when the browser's requests are already authorised without a console session (a token set by
 * the environment, e.g. a kiosk's fixed header); the gateway still checks every request.
 */
export async function authorisedOutside(): Promise<boolean> {
  const response = await fetch(`${env.gatewayOrigin}/api/auth/me`, {
    credentials: 'same-origin',
  }).catch(() => null);
  return response?.ok ?? false;
}

export function onSessionChange(listener: (s: TokenResponse | null) => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function set(next: TokenResponse | null): void {
  current = next;
  for (const l of listeners) l(next);
}

async function tokenCall(path: string, body?: unknown): Promise<TokenResponse | null> {
  const response = await fetch(`${env.gatewayOrigin}${path}`, {
    method: 'POST',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
    credentials: 'same-origin',
  });
  if (!response.ok) return null;
  const parsed = tokenResponseSchema.safeParse(await response.json());
  return parsed.success ? parsed.data : null;
}

/** Signs in; resolves to an error message, or null on success. */
export async function signIn(
  username: string,
  password: string,
  totp?: string,
): Promise<string | null> {
  const response = await fetch(`${env.gatewayOrigin}/api/auth/sign-in`, {
    method: 'POST',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
    body: JSON.stringify(totp ? { username, password, totp } : { username, password }),
    credentials: 'same-origin',
  });
  const body: unknown = await response.json().catch(() => null);
  const parsed = tokenResponseSchema.safeParse(body);
  if (response.ok && parsed.success) {
    set(parsed.data);
    return null;
  }
  const message = (body as { message?: unknown } | null)?.message;
  return typeof message === 'string' ? message : 'Sign-in failed';
}

let refreshing: Promise<boolean> | null = null;

/** Renews the access token from the refresh cookie; one renewal at a time. */
export function refresh(): Promise<boolean> {
  refreshing ??= tokenCall('/api/auth/refresh')
    .then((next) => {
      set(next);
      return next !== null;
    })
    .finally(() => {
      refreshing = null;
    });
  return refreshing;
}

export async function signOut(): Promise<void> {
  await authFetch(`${env.gatewayOrigin}/api/auth/sign-out`, {
    method: 'POST',
    credentials: 'same-origin',
  }).catch(() => undefined);
  set(null);
}

/** fetch with the access token; on a 401 it renews once and tries again, else the session ends. */
export async function authFetch(url: string, init: RequestInit = {}): Promise<Response> {
  const attempt = () => {
    const headers = new Headers(init.headers);
    if (current) headers.set('Authorization', `Bearer ${current.accessToken}`);
    return fetch(url, { ...init, headers });
  };
  const first = await attempt();
  if (first.status !== 401 || !current) return first;
  if (!(await refresh())) return first;
  return attempt();
}
