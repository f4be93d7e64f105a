import { Secret, TOTP } from 'otpauth';

/** What every authenticator app understands (RFC 6238 defaults; SHA1 is what apps support widely). */
export const TOTP_SETTINGS = { algorithm: 'SHA1', digits: 6, period: 30 } as const;
const ISSUER = 'Stillwell';

export type TotpAlgorithm = 'SHA1' | 'SHA256' | 'SHA512';

export function newTotpSecret(): string {
  return new Secret({ size: 20 }).base32;
}

/** The code for a key at a moment (settings default to TOTP_SETTINGS). */
export function totpCode(
  secret: Secret | string,
  timestampMs: number,
  settings: { algorithm?: TotpAlgorithm; digits?: number; period?: number } = {},
): string {
  return TOTP.generate({
    secret: typeof secret === 'string' ? Secret.fromBase32(secret) : secret,
    algorithm: settings.algorithm ?? TOTP_SETTINGS.algorithm,
    digits: settings.digits ?? TOTP_SETTINGS.digits,
    period: settings.period ?? TOTP_SETTINGS.period,
    timestamp: timestampMs,
  });
}

export function totpStep(timestampMs: number): number {
  return TOTP.counter({ period: TOTP_SETTINGS.period, timestamp: timestampMs });
}

/** The otpauth:// URI an authenticator app scans. */
export function totpUri(secretBase32: string, username: string): string {
  return new TOTP({
    issuer: ISSUER,
    label: username,
    secret: Secret.fromBase32(secretBase32),
    ...TOTP_SETTINGS,
  }).toString();
}

/**
 * Accepts a code for the current step or one either side (clock drift), but never a step at or
 * before the last one accepted: a code is good once (RFC 6238 section 5.2). Returns the step
 * to record, or null.
 */
export function acceptTotp(
  secretBase32: string,
  code: string,
  nowMs: number,
  lastStep: number | null,
): number | null {
  if (!/^\d{6}$/.test(code)) return null;
  const delta = TOTP.validate({
    token: code,
    secret: Secret.fromBase32(secretBase32),
    ...TOTP_SETTINGS,
    timestamp: nowMs,
    window: 1,
  });
  if (delta === null) return null;
  const step = totpStep(nowMs) + delta;
  return lastStep !== null && step <= lastStep ? null : step;
}
