import { z } from 'zod';
import { apiErrorSchema } from '@stillwell/shared/http';
import { describeIssues } from '@stillwell/shared/telemetry';
import { env } from '../config/env';
import { authFetch } from './auth-session';

/** A failed request to the gateway. status 0 means the gateway could not be reached at all. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly path: string,
    /** each problem the gateway listed (a 400 names the field and row in each) */
    readonly details: readonly string[] = [],
    /** the machine-readable reason, where the gateway gives one (step-up-required, own-order...) */
    readonly code?: string,
    /** the whole error body, for refusals that carry more (an order's interlock report) */
    readonly body?: unknown,
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
  let details: string[] = [];
  let code: string | undefined;
  let raw: unknown;
  try {
    raw = await response.json();
    const body = apiErrorSchema.safeParse(raw);
    if (body.success) {
      details = Array.isArray(body.data.message) ? body.data.message : [body.data.message];
      message = details.join('; ') || message;
      code = body.data.code;
    }
  } catch {
    // Not JSON (a proxy's error page): the status line is all there is.
  }
  return new ApiError(response.status, message, path, details, code, raw);
}

/**
 * GET a JSON resource and check it against its schema. This is the console's one way to reach the
 * gateway over HTTP, so sign-in attaches its token and handles 401 here only (through authFetch).
 */
export async function apiGet<S extends z.ZodType>(
  path: string,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  const headers = new Headers({ Accept: 'application/json' });
  let response: Response;
  try {
    response = await authFetch(buildUrl(path, options.query), {
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

/**
 * POST a JSON body and check the answer against its schema; the same error handling as apiGet.
 */
export async function apiPost<S extends z.ZodType>(
  path: string,
  body: unknown,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  let response: Response;
  try {
    response = await authFetch(buildUrl(path, options.query), {
      method: 'POST',
      headers: new Headers({ Accept: 'application/json', 'Content-Type': 'application/json' }),
      body: JSON.stringify(body),
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
    throw new ApiError(
      response.status,
      `Unexpected answer from the gateway: ${describeIssues(parsed.error)}`,
      path,
    );
  }
  return parsed.data;
}

async function send(path: string, init: RequestInit, options: RequestOptions): Promise<Response> {
  let response: Response;
  try {
    response = await authFetch(buildUrl(path, options.query), {
      ...init,
      signal: options.signal,
      credentials: 'same-origin',
    });
  } catch (error) {
    if (options.signal?.aborted) throw error;
    throw new ApiError(0, 'The gateway cannot be reached', path);
  }
  if (!response.ok) throw await toApiError(response, path);
  return response;
}

async function checked<S extends z.ZodType>(
  response: Response,
  schema: S,
  path: string,
): Promise<z.output<S>> {
  const parsed = schema.safeParse(await response.json());
  if (!parsed.success) {
    throw new ApiError(
      response.status,
      `Unexpected answer from the gateway: ${describeIssues(parsed.error)}`,
      path,
    );
  }
  return parsed.data;
}

/** PUT a JSON body; the same error handling as apiGet. */
export async function apiPut<S extends z.ZodType>(
  path: string,
  body: unknown,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  const headers = new Headers({ Accept: 'application/json', 'Content-Type': 'application/json' });
  const response = await send(
    path,
    { method: 'PUT', headers, body: JSON.stringify(body) },
    options,
  );
  return checked(response, schema, path);
}

/** POST a multipart form (files with fields); the browser sets the boundary. */
export async function apiPostForm<S extends z.ZodType>(
  path: string,
  form: FormData,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  const headers = new Headers({ Accept: 'application/json' });
  const response = await send(path, { method: 'POST', headers, body: form }, options);
  return checked(response, schema, path);
}

/** GET a file (an export, an attachment) as a Blob with the name the gateway gave it. */
export async function apiDownload(
  path: string,
  options: RequestOptions = {},
): Promise<{ blob: Blob; filename: string | null }> {
  const response = await send(path, { method: 'GET' }, options);
  const disposition = response.headers.get('Content-Disposition') ?? '';
  const filename = /filename="([^"]+)"/.exec(disposition)?.[1] ?? null;
  return { blob: await response.blob(), filename };
}

/** A short, operator-facing sentence for any error a query can end in. */
export function describeError(error: unknown): string {
  if (error instanceof ApiError) {
    return error.status === 0 ? error.message : `${error.message} (HTTP ${error.status})`;
  }
  return error instanceof Error ? error.message : String(error);
}
