import { useSyncExternalStore } from 'react';
import {
  apiErrorSchema,
  tokenResponseSchema,
  type AccessErrorCode,
  type Me,
  type TokenResponse,
} from '@stillwell/shared/access';
import { env } from '../config/env';

/**
 * The signed-in session: the short-lived access token in memory only (never in storage), renewed
 * through the httpOnly refresh cookie before it runs out. Every request and the live socket take
 * their token here.
 */
let current: TokenResponse | null = null;
const listeners = new Set<(s: TokenResponse | null) => void>();
let renewTimer: ReturnType<typeof setTimeout> | undefined;

/** Renew this long before the token runs out, so no request meets an expired one. */
const RENEW_AHEAD_MS = 60_000;
/** After a renewal that could not reach the gateway, try again this soon. */
const RETRY_MS = 15_000;

export function session(): TokenResponse | null {
  return current;
}

/** The current session for a component; re-renders on sign-in, renewal and sign-out. */
export function useSession(): TokenResponse | null {
  return useSyncExternalStore(onSessionChange, session, session);
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
  clearTimeout(renewTimer);
  if (next) scheduleRenewal(Date.parse(next.expiresAt) - Date.now() - RENEW_AHEAD_MS);
  for (const l of listeners) l(next);
}

function scheduleRenewal(inMs: number): void {
  renewTimer = setTimeout(
    () => {
      refresh().catch(() => scheduleRenewal(RETRY_MS));
    },
    Math.max(inMs, 5_000),
  );
}

/** After the account changed (password, second factor, step-up): the same token, a newer picture. */
export function updateMe(me: Me): void {
  if (current) set({ ...current, me });
}

export interface SignInRefusal {
  code: AccessErrorCode | null;
  message: string;
  retryAfterS?: number;
}

/** Signs in; resolves to the refusal, or null on success. */
export async function signIn(
  username: string,
  password: string,
  totp?: string,
): Promise<SignInRefusal | null> {
  const response = await fetch(`${env.gatewayOrigin}/api/auth/sign-in`, {
    method: 'POST',
    headers: { Accept: 'application/json', 'Content-Type': 'application/json' },
    body: JSON.stringify(totp ? { username, password, totp } : { username, password }),
    credentials: 'same-origin',
  }).catch(() => null);
  if (!response) return { code: null, message: 'The gateway cannot be reached' };
  const body: unknown = await response.json().catch(() => null);
  const parsed = tokenResponseSchema.safeParse(body);
  if (response.ok && parsed.success) {
    set(parsed.data);
    return null;
  }
  const refusal = apiErrorSchema.safeParse(body);
  if (refusal.success) {
    const { code, message, retryAfterS } = refusal.data;
    return { code, message, retryAfterS };
  }
  const message = (body as { message?: unknown } | null)?.message;
  return { code: null, message: typeof message === 'string' ? message : 'Sign-in failed' };
}

/**
 * One renewal at a time across the browser's tabs: two tabs presenting the same refresh cookie at
 * once look like a stolen token to the gateway, which then ends the session (docs/security.md).
 */
function oneAtATime<T>(run: () => Promise<T>): Promise<T> {
  const locks = typeof navigator !== 'undefined' ? navigator.locks : undefined;
  return locks?.request ? locks.request('stillwell-refresh', run) : run();
}

/** null when the gateway refused the cookie (the session is over); throws when unreachable. */
async function renew(): Promise<TokenResponse | null> {
  const response = await fetch(`${env.gatewayOrigin}/api/auth/refresh`, {
    method: 'POST',
    headers: { Accept: 'application/json' },
    credentials: 'same-origin',
  });
  if (response.status >= 500 || response.status === 429) {
    throw new Error(`refresh: HTTP ${response.status}`);
  }
  if (!response.ok) return null;
  const parsed = tokenResponseSchema.safeParse(await response.json());
  return parsed.success ? parsed.data : null;
}

let refreshing: Promise<boolean> | null = null;

/**
 * Renews the access token from the refresh cookie; one renewal at a time. Resolves false when the
 * session is over (and signs out); rejects when the gateway could not be reached (the session stays).
 */
export function refresh(): Promise<boolean> {
  refreshing ??= oneAtATime(renew)
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
  if (!(await refresh().catch(() => false))) return first;
  return attempt();
}
