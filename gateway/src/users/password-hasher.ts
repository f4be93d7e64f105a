import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import { normalizePassword } from '@stillwell/shared/access';

export interface ScryptParams {
  /** CPU/memory cost, a power of two; memory is about 128 * N * r bytes */
  N: number;
  r: number;
  p: number;
}

export type Kdf = (
  password: string,
  salt: Buffer,
  keyLength: number,
  options: ScryptOptions,
) => Promise<Buffer>;

const KEY_LENGTH = 32;
const SALT_LENGTH = 16;

const scryptKdf: Kdf = (password, salt, keyLength, options) =>
  new Promise((resolve, reject) =>
    scrypt(password, salt, keyLength, options, (error, key) =>
      error ? reject(error) : resolve(key),
    ),
  );

interface Decoded extends ScryptParams {
  salt: Buffer;
  hash: Buffer;
}

/** `scrypt$N$r$p$salt$hash`, salt and hash in base64: the parameters are stored with each hash. */
export function decodeHash(encoded: string): Decoded | null {
  const parts = encoded.split('$');
  if (parts.length !== 6 || parts[0] !== 'scrypt') return null;
  const [N, r, p] = parts.slice(1, 4).map(Number) as [number, number, number];
  if (![N, r, p].every((n) => Number.isInteger(n) && n > 0)) return null;
  const salt = Buffer.from(parts[4]!, 'base64');
  const hash = Buffer.from(parts[5]!, 'base64');
  if (salt.length < 16 || hash.length < 16) return null;
  return { N, r, p, salt, hash };
}

/**
 * Password hashing with node:crypto scrypt (RFC 7914), memory-hard. The password is NFKC-normalised
 * first (NIST SP 800-63B 5.1.1.2), and compared in constant time.
 */
export class PasswordHasher {
  private dummy?: Promise<string>;

  constructor(
    readonly params: ScryptParams,
    private readonly kdf: Kdf = scryptKdf,
  ) {}

  async hash(password: string): Promise<string> {
    const salt = randomBytes(SALT_LENGTH);
    const { N, r, p } = this.params;
    const key = await this.derive(password, salt, this.params, KEY_LENGTH);
    return `scrypt$${N}$${r}$${p}$${salt.toString('base64')}$${key.toString('base64')}`;
  }

  /**
   * True when the password matches. Without a stored hash (an unknown user) it still does the same
   * work against a dummy hash, so the answer takes as long and says nothing about who exists.
   */
  async verify(password: string, encoded: string | null): Promise<boolean> {
    const stored = encoded === null ? null : decodeHash(encoded);
    const target = stored ?? decodeHash(await this.dummyHash())!;
    const key = await this.derive(password, target.salt, target, target.hash.length);
    return timingSafeEqual(key, target.hash) && stored !== null;
  }

  /** A stored hash made with weaker parameters than today's: rehash at the next good sign-in. */
  needsRehash(encoded: string): boolean {
    const d = decodeHash(encoded);
    if (!d) return true;
    return d.N < this.params.N || d.r < this.params.r || d.p < this.params.p;
  }

  private dummyHash(): Promise<string> {
    this.dummy ??= this.hash(randomBytes(24).toString('base64'));
    return this.dummy;
  }

  private derive(
    password: string,
    salt: Buffer,
    params: ScryptParams,
    keyLength: number,
  ): Promise<Buffer> {
    const { N, r, p } = params;
    // node's default maxmem (32 MiB) is below what N = 2^15 and up need
    return this.kdf(normalizePassword(password), salt, keyLength, {
      N,
      r,
      p,
      maxmem: 256 * N * r + 2 ** 20,
    });
  }
}
