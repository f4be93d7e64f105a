import type { Request, Response } from 'express';
import { REFRESH_COOKIE, REFRESH_COOKIE_PATH } from '@stillwell/shared/access';
import { AccessError } from '../common/errors/access-error';

/** httpOnly (no script reads it), SameSite=Strict (no other site sends it), only to /api/auth. */
export function setRefreshCookie(
  res: Response,
  token: string,
  expiresAt: number,
  secure: boolean,
): void {
  res.cookie(REFRESH_COOKIE, token, {
    httpOnly: true,
    sameSite: 'strict',
    secure,
    path: REFRESH_COOKIE_PATH,
    expires: new Date(expiresAt),
  });
}

export function clearRefreshCookie(res: Response, secure: boolean): void {
  res.clearCookie(REFRESH_COOKIE, {
    httpOnly: true,
    sameSite: 'strict',
    secure,
    path: REFRESH_COOKIE_PATH,
  });
}

export function readRefreshCookie(req: Request): string | undefined {
  const value = (req.cookies as Record<string, unknown> | undefined)?.[REFRESH_COOKIE];
  return typeof value === 'string' ? value : undefined;
}

/**
 * The cookie-authenticated route (refresh) also checks Origin when the browser sends one: the
 * console's configured origins, or the gateway's own. SameSite=Strict already stops cross-site
 * requests; this is the second lock.
 */
export function assertConsoleOrigin(req: Request, allowed: readonly string[]): void {
  const origin = req.headers.origin;
  if (origin === undefined) return;
  const own = `${req.protocol}://${req.headers.host ?? ''}`;
  if (origin !== own && !allowed.includes(origin)) throw new AccessError('origin-refused');
}

export function clientMeta(req: Request): { userAgent: string | null; ip: string | null } {
  return { userAgent: req.headers['user-agent'] ?? null, ip: req.ip ?? null };
}
