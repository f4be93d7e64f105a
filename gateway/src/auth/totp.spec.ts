import { Secret } from 'otpauth';
import { acceptTotp, newTotpSecret, totpCode, totpStep, totpUri, type TotpAlgorithm } from './totp';

/**
 * RFC 6238 Appendix B test vectors: 8-digit codes, 30-second steps, T0 = 0, with the ASCII seeds
 * "12345678901234567890" repeated to 20 (SHA1), 32 (SHA256) and 64 (SHA512) bytes.
 */
const SEEDS: Record<TotpAlgorithm, string> = {
  SHA1: '12345678901234567890',
  SHA256: '12345678901234567890123456789012',
  SHA512: '1234567890123456789012345678901234567890123456789012345678901234',
};
const RFC6238_APPENDIX_B: Array<[number, TotpAlgorithm, string]> = [
  [59, 'SHA1', '94287082'],
  [59, 'SHA256', '46119246'],
  [59, 'SHA512', '90693936'],
  [1111111109, 'SHA1', '07081804'],
  [1111111109, 'SHA256', '68084774'],
  [1111111109, 'SHA512', '25091201'],
  [1111111111, 'SHA1', '14050471'],
  [1111111111, 'SHA256', '67062674'],
  [1111111111, 'SHA512', '99943326'],
  [1234567890, 'SHA1', '89005924'],
  [1234567890, 'SHA256', '91819424'],
  [1234567890, 'SHA512', '93441116'],
  [2000000000, 'SHA1', '69279037'],
  [2000000000, 'SHA256', '90698825'],
  [2000000000, 'SHA512', '38618901'],
  [20000000000, 'SHA1', '65353130'],
  [20000000000, 'SHA256', '77737706'],
  [20000000000, 'SHA512', '47863826'],
];

describe('TOTP', () => {
  it.each(RFC6238_APPENDIX_B)(
    'matches RFC 6238 Appendix B at T=%i s with %s',
    (t, algorithm, expected) => {
      expect(
        totpCode(Secret.fromLatin1(SEEDS[algorithm]), t * 1000, { algorithm, digits: 8 }),
      ).toBe(expected);
    },
  );

  it('accepts the current code once, and the neighbouring steps for clock drift', () => {
    const secret = newTotpSecret();
    const now = Date.UTC(2031, 2, 4, 3, 0, 10);
    const code = totpCode(secret, now);
    const step = acceptTotp(secret, code, now, null);
    expect(step).toBe(totpStep(now));
    // replay of the same code: refused (RFC 6238 section 5.2)
    expect(acceptTotp(secret, code, now + 5000, step)).toBeNull();
    expect(acceptTotp(secret, totpCode(secret, now - 30_000), now, null)).toBe(step! - 1);
    expect(acceptTotp(secret, totpCode(secret, now + 30_000), now, step)).toBe(step! + 1);
    expect(acceptTotp(secret, totpCode(secret, now - 90_000), now, null)).toBeNull();
  });

  it('refuses a wrong or malformed code and a code for another key', () => {
    const secret = newTotpSecret();
    const now = Date.now();
    const code = totpCode(secret, now);
    const wrong = String((Number(code) + 1) % 1_000_000).padStart(6, '0');
    expect(acceptTotp(secret, wrong, now, null)).toBeNull();
    expect(acceptTotp(secret, `${code} `, now, null)).toBeNull();
    expect(acceptTotp(newTotpSecret(), code, now, null)).toBeNull();
  });

  it('writes an otpauth URI an authenticator can scan', () => {
    const secret = newTotpSecret();
    expect(secret).toMatch(/^[A-Z2-7]{32}$/);
    const uri = new URL(totpUri(secret, 'mara.quill'));
    expect(uri.protocol).toBe('otpauth:');
    expect(uri.host).toBe('totp');
    expect(uri.searchParams.get('secret')).toBe(secret);
    expect(uri.searchParams.get('issuer')).toBe('Stillwell');
    expect(uri.searchParams.get('digits')).toBe('6');
  });
});
