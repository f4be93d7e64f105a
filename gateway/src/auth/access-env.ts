import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');
const origins = z
  .string()
  .transform((s) =>
    s
      .split(',')
      .map((o) => o.trim())
      .filter(Boolean),
  )
  .pipe(z.array(z.string().url()).min(1));

/** Sign-in, tokens, sessions and HTTP hardening (see docs/security.md). */
export const accessEnv = {
  /** HS256 key of the access tokens; required outside demo mode, random per start in demo mode when unset */
  JWT_SECRET: z.string().min(32).optional(),
  ACCESS_TOKEN_TTL_S: z.coerce.number().int().min(10).max(3600).default(900),
  /** a session (a refresh-token family) ends this long after sign-in, whatever happens */
  SESSION_MAX_AGE_H: z.coerce
    .number()
    .min(0.01)
    .max(24 * 30)
    .default(12),
  STEP_UP_TTL_S: z.coerce.number().int().min(10).max(3600).default(300),
  /** scrypt cost N (a power of two, at least 2^14); raising it rehashes each password at its next sign-in */
  PASSWORD_SCRYPT_N: z.coerce
    .number()
    .int()
    .min(2 ** 14)
    .max(2 ** 20)
    .refine((n) => (n & (n - 1)) === 0, 'a power of two')
    .default(2 ** 17),
  /** requests to the sign-in and step-up routes per address per minute */
  SIGN_IN_RATE_PER_MIN: z.coerce.number().int().min(1).max(10_000).default(10),
  /** failures of one account before its delay starts (then SIGN_IN_FIRST_DELAY_S, doubling, up to the cap) */
  SIGN_IN_FREE_FAILURES: z.coerce.number().int().min(1).max(100).default(5),
  SIGN_IN_FIRST_DELAY_S: z.coerce.number().int().min(1).max(3600).default(1),
  SIGN_IN_MAX_DELAY_S: z.coerce.number().int().min(1).max(86_400).default(900),
  /** the console's origins (comma-separated) for CORS and the refresh route's origin check */
  CONSOLE_ORIGIN: origins.default(['http://localhost:3000', 'http://localhost:5173']),
  /** Secure on the refresh cookie; default: on outside demo mode (serve over TLS there) */
  COOKIE_SECURE: bool.optional(),
  /** express "trust proxy" (e.g. 1, or loopback) when behind a reverse proxy, so per-address limits see clients */
  TRUST_PROXY: z.string().optional(),
};
