import type { z } from 'zod';
import { apiErrorSchema } from '@stillwell/shared/http';
import { env } from '../../../config/env';
import { ApiError } from '../../../lib/api-client';
import { authFetch } from '../../../lib/auth-session';

type Method = 'POST' | 'PATCH' | 'DELETE';

/**
 * PATCH, DELETE and the answers without a body (204) that lib/api-client does not cover yet; the same
 * token handling (authFetch) and the same ApiError, so screens treat every refusal alike.
 */
export function apiSend(method: Method, path: string, body: unknown, schema: null): Promise<void>;
export function apiSend<S extends z.ZodType>(
  method: Method,
  path: string,
  body: unknown,
  schema: S,
): Promise<z.output<S>>;
export async function apiSend(
  method: Method,
  path: string,
  body: unknown,
  schema: z.ZodType | null,
): Promise<unknown> {
  let response: Response;
  try {
    response = await authFetch(`${env.gatewayOrigin}${path}`, {
      method,
      headers: new Headers({ Accept: 'application/json', 'Content-Type': 'application/json' }),
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'The gateway cannot be reached', path);
  }
  const raw: unknown = response.status === 204 ? null : await response.json().catch(() => null);
  if (!response.ok) {
    const error = apiErrorSchema.safeParse(raw);
    const details = error.success ? [error.data.message].flat() : [];
    const message = details.join('; ') || `${response.status} ${response.statusText}`.trim();
    throw new ApiError(response.status, message, path, details, error.data?.code, raw);
  }
  if (!schema) return undefined;
  const parsed = schema.safeParse(raw);
  if (!parsed.success)
    throw new ApiError(response.status, 'Unexpected answer from the gateway', path);
  return parsed.data;
}
