import { z } from 'zod';
import { apiErrorSchema } from '@stillwell/shared/http';
import { describeIssues } from '@stillwell/shared/telemetry';
import { env } from '../config/env';

/** A failed request to the gateway. status 0 means the gateway could not be reached at all. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly path: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export interface RequestOptions {
  signal?: AbortSignal;
  query?: Record<string, string>;
}

function buildUrl(path: string, query?: Record<string, string>): string {
  const search = query ? `?${new URLSearchParams(query).toString()}` : '';
  return `${env.gatewayOrigin}${path}${search}`;
}

async function toApiError(response: Response, path: string): Promise<ApiError> {
  let message = `${response.status} ${response.statusText}`.trim();
  try {
    const body = apiErrorSchema.safeParse(await response.json());
    if (body.success) {
      const text = Array.isArray(body.data.message)
        ? body.data.message.join('; ')
        : body.data.message;
      message = text || message;
    }
  } catch {
    // Not JSON (a proxy's error page): the status line is all there is.
  }
  return new ApiError(response.status, message, path);
}

/**
 * GET a JSON resource and check it against its schema. This is the console's one way to reach the
 * gateway over HTTP, so sign-in (a later issue) attaches its token and handles 401 here only.
 */
export async function apiGet<S extends z.ZodType>(
  path: string,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  const headers = new Headers({ Accept: 'application/json' });
  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      headers,
      signal: options.signal,
      credentials: 'same-origin',
    });
  } catch (error) {
    if (options.signal?.aborted) throw error;
    throw new ApiError(0, 'The gateway cannot be reached', path);
  }
  if (!response.ok) throw await toApiError(response, path);
  const parsed = schema.safeParse(await response.json());
  if (!parsed.success) {
    // A shape we do not know is refused rather than shown half-understood.
    throw new ApiError(
      response.status,
      `Unexpected answer from the gateway: ${describeIssues(parsed.error)}`,
      path,
    );
  }
  return parsed.data;
}

/** A short, operator-facing sentence for any error a query can end in. */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    return error.status === 0 ? error.message : `${error.message} (HTTP ${error.status})`;
  }
  return error instanceof Error ? error.message : String(error);
}
