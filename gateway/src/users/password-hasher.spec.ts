import { scrypt, type ScryptOptions } from 'node:crypto';
import { commonPasswordCount, isCommonPassword } from './common-passwords';
import { decodeHash, PasswordHasher, type Kdf } from './password-hasher';

/** node:crypto scrypt, counted: the tests see how much work each call really did. */
function countingScrypt() {
  const calls: ScryptOptions[] = [];
  const kdf: Kdf = (password, salt, keyLength, options) =>
    new Promise((resolve, reject) => {
      calls.push(options);
      scrypt(password, salt, keyLength, options, (e, k) => (e ? reject(e) : resolve(k)));
    });
  return { kdf, calls };
}

describe('PasswordHasher (scrypt, RFC 7914)', () => {
  const params = { N: 2 ** 14, r: 8, p: 1 };

  it('stores N, r, p, a 16-byte salt and the key with each hash, and verifies only the right password', async () => {
    const hasher = new PasswordHasher(params);
    const encoded = await hasher.hash('heron-sluice-lantern');
    expect(encoded).toMatch(/^scrypt\$16384\$8\$1\$[A-Za-z0-9+/=]+\$[A-Za-z0-9+/=]+$/);
    expect(decodeHash(encoded)).toMatchObject({ N: 16384, r: 8, p: 1 });
    expect(decodeHash(encoded)!.salt).toHaveLength(16);
    expect(await hasher.verify('heron-sluice-lantern', encoded)).toBe(true);
    expect(await hasher.verify('heron-sluice-lanterN', encoded)).toBe(false);
    // a new salt each time
    expect(await hasher.hash('heron-sluice-lantern')).not.toBe(encoded);
  });

  it('compares NFKC forms, so the same password typed on another keyboard still matches', async () => {
    const hasher = new PasswordHasher(params);
    const encoded = await hasher.hash('ﬁeld-gauge-2031'); // starts with U+FB01, the "fi" ligature
    expect(await hasher.verify('field-gauge-2031', encoded)).toBe(true);
  });

  it('does the same scrypt work for an unknown user as for a known one, and says no', async () => {
    const { kdf, calls } = countingScrypt();
    const hasher = new PasswordHasher(params, kdf);
    const encoded = await hasher.hash('spillway-crest-207');
    calls.length = 0;
    expect(await hasher.verify('spillway-crest-207', null)).toBe(false);
    expect(await hasher.verify('anything', 'garbage')).toBe(false);
    const unknownWork = calls.filter((c) => c.N === params.N && c.r === params.r).length;
    calls.length = 0;
    await hasher.verify('wrong', encoded);
    // the dummy hash is made once (one extra call), then each check costs one full scrypt
    expect(unknownWork).toBe(3);
    expect(calls).toHaveLength(1);
    expect(calls[0]).toMatchObject({ N: params.N, r: 8, p: 1 });
  });

  it("verifies a hash made with other parameters, and asks for a rehash when today's are stronger", async () => {
    const old = await new PasswordHasher(params).hash('tamsel-river-flood');
    const stronger = new PasswordHasher({ N: 2 ** 15, r: 8, p: 1 });
    expect(await stronger.verify('tamsel-river-flood', old)).toBe(true);
    expect(stronger.needsRehash(old)).toBe(true);
    expect(stronger.needsRehash(await stronger.hash('tamsel-river-flood'))).toBe(false);
  });

  it('checks against the shipped common-password list (@zxcvbn-ts/language-common)', () => {
    expect(commonPasswordCount()).toBeGreaterThan(40_000);
    for (const p of ['password', '12345678', 'iloveyou', 'sunshine1'])
      expect(isCommonPassword(p)).toBe(true);
    expect(isCommonPassword('heron-sluice-lantern')).toBe(false);
  });
});
