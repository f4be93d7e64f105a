import request from 'supertest';
import { REFRESH_COOKIE, type Role, type TokenResponse } from '@stillwell/shared/access';
import { DemoUsersSeeder } from '../../src/users/demo-users';
import type { TestGateway } from './gateway';

export interface SignedInUser {
  username: string;
  password: string;
  token: string;
  /** the refresh cookie as the browser would send it back */
  cookie: string;
  me: TokenResponse['me'];
}

/** This start's demo password of a role (demo mode prints them; the test reads them in-process). */
export function demoCredentials(
  gateway: TestGateway,
  role: Role,
): { username: string; password: string } {
  const c = gateway.app.get(DemoUsersSeeder).credentials.get(role);
  if (!c) throw new Error(`no demo account for ${role}: is DEMO_MODE on?`);
  return c;
}

export function refreshCookieOf(res: request.Response): string {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  const cookie = raw?.find((c) => c.startsWith(`${REFRESH_COOKIE}=`));
  if (!cookie) throw new Error(`no refresh cookie in ${JSON.stringify(raw)}`);
  return cookie.split(';')[0]!;
}

export async function signIn(
  gateway: TestGateway,
  username: string,
  password: string,
  totp?: string,
): Promise<SignedInUser> {
  const res = await request(gateway.url)
    .post('/api/auth/sign-in')
    .send({ username, password, ...(totp ? { totp } : {}) })
    .expect(200);
  const body = res.body as TokenResponse;
  return { username, password, token: body.accessToken, cookie: refreshCookieOf(res), me: body.me };
}

export async function signInAs(gateway: TestGateway, role: Role): Promise<SignedInUser> {
  const c = demoCredentials(gateway, role);
  return signIn(gateway, c.username, c.password);
}

export async function stepUp(
  gateway: TestGateway,
  user: SignedInUser,
  totp?: string,
): Promise<void> {
  await request(gateway.url)
    .post('/api/auth/step-up')
    .set('Authorization', `Bearer ${user.token}`)
    .send({ password: user.password, ...(totp ? { totp } : {}) })
    .expect(200);
}

/** The environment every access test gateway starts with: a known key, cheap hashing. */
export const ACCESS_TEST_ENV = {
  DEMO_MODE: 'true',
  JWT_SECRET: 'test-only-key-0123456789abcdefghijklmnopqrstuvwxyz',
  // 2^14 keeps the tests quick; production's default is 2^17 (the same code path)
  PASSWORD_SCRYPT_N: String(2 ** 14),
  SIGN_IN_RATE_PER_MIN: '200',
};
