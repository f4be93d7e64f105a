import { z } from 'zod';
import { passwordProblemSchema } from './password.js';

/**
 * Machine-readable reasons the gateway gives with a refusal, so the console can act on them
 * (401: refresh the token, then sign in; 403 step-up-required: ask for the password again).
 * The HTTP status of each is fixed in the gateway (common/errors/access-error.ts).
 */
export const ACCESS_ERROR_CODES = [
  // the access token
  'unauthenticated',
  'token-expired',
  'token-invalid',
  'session-ended',
  // the permission matrix and the extra conditions on a route
  'forbidden',
  'step-up-required',
  'password-change-required',
  'route-not-declared',
  // signing in and refreshing
  'invalid-credentials',
  'totp-required',
  'totp-invalid',
  'too-many-attempts',
  'too-many-requests',
  'refresh-invalid',
  'origin-refused',
  // re-confirming identity while signed in (403, so the console does not treat it as signed out)
  'wrong-password',
  'wrong-totp',
  // accounts
  'password-rejected',
  'username-taken',
  'user-not-found',
  'session-not-found',
  'last-admin',
  'admin-exists',
  'totp-already-enabled',
  'totp-not-enabled',
  'totp-not-started',
] as const;
export const accessErrorCodeSchema = z.enum(ACCESS_ERROR_CODES);
export type AccessErrorCode = z.infer<typeof accessErrorCodeSchema>;

/** The body of every refusal the gateway's access layer gives. */
export const apiErrorSchema = z.object({
  statusCode: z.number().int(),
  code: accessErrorCodeSchema,
  message: z.string(),
  /** password-rejected: which rules the new password breaks */
  problems: z.array(passwordProblemSchema).optional(),
  /** too-many-attempts / too-many-requests: seconds before another attempt is considered */
  retryAfterS: z.number().int().optional(),
});
export type ApiError = z.infer<typeof apiErrorSchema>;
