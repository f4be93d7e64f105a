import { createHmac } from 'node:crypto';

const b64url = (v: string | Buffer) => Buffer.from(v).toString('base64url');

/** A JWT made by hand, so that tests can forge exactly what an attacker would send. */
export function forgeJwt(
  header: Record<string, unknown>,
  payload: Record<string, unknown>,
  key?: string,
): string {
  const head = `${b64url(JSON.stringify(header))}.${b64url(JSON.stringify(payload))}`;
  const signature =
    key === undefined ? '' : createHmac('sha256', key).update(head).digest('base64url');
  return `${head}.${signature}`;
}

export function decodeJwt(token: string): {
  header: Record<string, unknown>;
  payload: Record<string, unknown>;
} {
  const [h, p] = token.split('.');
  return {
    header: JSON.parse(Buffer.from(h!, 'base64url').toString()) as Record<string, unknown>,
    payload: JSON.parse(Buffer.from(p!, 'base64url').toString()) as Record<string, unknown>,
  };
}
