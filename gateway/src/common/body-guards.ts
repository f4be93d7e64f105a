import { STATUS_CODES } from 'node:http';
import type { NextFunction, Request, Response } from 'express';

/** Request bodies larger than this are refused before they are parsed (JSON and forms). */
export const BODY_LIMIT_BYTES = 1024 * 1024;
/** Deeper JSON is refused before it is parsed: no API body needs more, and recursion must end. */
export const MAX_JSON_DEPTH = 64;

const ACCEPTED_TYPES = [
  'application/json',
  'multipart/form-data',
  'application/x-www-form-urlencoded',
];

/** A body-parser error with the status and wording it will be answered with. */
class BodyError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly type = 'entity.refused',
  ) {
    super(message);
  }
}

/**
 * Counts how deep arrays and objects nest in raw JSON bytes, skipping strings, and throws past
 * MAX_JSON_DEPTH. Linear and without recursion, so a nesting bomb costs one pass (RFC 8259 §9 lets
 * a parser limit nesting depth).
 */
export function checkJsonDepth(bytes: Uint8Array): void {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < bytes.length; i += 1) {
    const b = bytes[i];
    if (inString) {
      if (b === 0x5c)
        i += 1; // backslash: skip the escaped byte
      else if (b === 0x22) inString = false;
    } else if (b === 0x22) inString = true;
    else if (b === 0x5b || b === 0x7b) {
      depth += 1;
      if (depth > MAX_JSON_DEPTH)
        throw new BodyError(400, `the body is nested deeper than ${MAX_JSON_DEPTH} levels`);
    } else if (b === 0x5d || b === 0x7d) depth -= 1;
  }
}

const hasBody = (req: Request) =>
  Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined;

/** Refuses a body of a type no route reads (415), before any parser sees it. */
export function refuseUnknownBodyTypes(req: Request, res: Response, next: NextFunction): void {
  if (!req.path.startsWith('/api/') || !hasBody(req)) return next();
  const type = (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
  if (ACCEPTED_TYPES.includes(type) || /^application\/[\w.-]+\+json$/.test(type)) return next();
  res.status(415).json({
    statusCode: 415,
    error: 'Unsupported Media Type',
    message: `Content-Type ${type || '(none)'} is not accepted: send application/json (multipart/form-data for file uploads)`,
  });
}

const MB = (n: number) => `${+(n / 1024 / 1024).toFixed(1)} MB`;

/** Plain words for body-parser's errors (its `type` codes), in the gateway's error shape. */
function describe(err: {
  type?: string;
  status?: number;
  message: string;
  charset?: string;
  encoding?: string;
  limit?: number;
}): {
  status: number;
  message: string;
} {
  switch (err.type) {
    case 'entity.too.large':
      return {
        status: 413,
        message: `the request body is over the limit of ${MB(err.limit ?? BODY_LIMIT_BYTES)}`,
      };
    case 'entity.parse.failed':
      return { status: 400, message: `the body is not valid JSON (RFC 8259): ${err.message}` };
    case 'charset.unsupported':
      return {
        status: 415,
        message: `charset "${(err.charset ?? '').toLowerCase()}" is not supported: send application/json in UTF-8`,
      };
    case 'encoding.unsupported':
      return {
        status: 415,
        message: `Content-Encoding "${err.encoding ?? ''}" is not supported: send identity, gzip or deflate`,
      };
    case 'request.size.invalid':
      return { status: 400, message: 'the body is not as long as its Content-Length says' };
    case 'request.aborted':
      return { status: 400, message: 'the request was aborted before its body arrived' };
    case 'parameters.too.many':
      return { status: 413, message: 'the form has too many fields' };
    default:
      return { status: err.status ?? 400, message: err.message || 'the body could not be read' };
  }
}

/** Express error handler placed right after the body parsers: answers their errors plainly. */
export function answerBodyErrors(
  err: unknown,
  _req: Request,
  res: Response,
  next: NextFunction,
): void {
  const e = err as { type?: string; status?: number; message: string };
  const isBodyError =
    err instanceof BodyError || (typeof e?.type === 'string' && typeof e?.status === 'number');
  if (!isBodyError || res.headersSent) return next(err);
  // a verify hook's error comes wrapped by body-parser with its own status and message
  const { status, message } = err instanceof BodyError ? err : describe(e);
  res.status(status).json({ statusCode: status, error: STATUS_CODES[status], message });
}

/** body-parser's verify hook: the depth check, raised as a BodyError body-parser passes on. */
export function verifyJson(_req: Request, _res: Response, buf: Buffer): void {
  checkJsonDepth(buf);
}
