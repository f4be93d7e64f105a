import { describe, expect, it } from 'vitest';
import { checkPassword, newPasswordSchema, passwordLength, PASSWORD_RULES } from './password.js';

// A stand-in for the shipped list (the gateway passes @zxcvbn-ts/language-common's).
const common = new Set(['password', 'password1', 'qwertyuiop', 'iloveyou123']);
const isCommon = (p: string) => common.has(p);

describe('password rules (NIST SP 800-63B 5.1.1.2)', () => {
  it('asks 8 characters of everyone and 15 of an administrator', () => {
    expect(checkPassword('tidal-ox')).toEqual([]);
    expect(checkPassword('tidal-o')).toEqual(['too-short']);
    expect(checkPassword('fourteen-chars', { roles: ['operator', 'admin'] })).toEqual([
      'too-short',
    ]);
    expect(checkPassword('fifteen-chars!!', { roles: ['admin'] })).toEqual([]);
    expect(PASSWORD_RULES).toMatchObject({ minLength: 8, adminMinLength: 15, maxLength: 128 });
  });

  it('has a ceiling and no composition rules', () => {
    expect(checkPassword('a'.repeat(64) + 'b'.repeat(65))).toEqual(['too-long']);
    expect(checkPassword('x'.repeat(63) + 'y'.repeat(65))).toEqual([]);
    // all lower case, no digits, no symbols: fine
    expect(checkPassword('heronsoverthesluice')).toEqual([]);
  });

  it('counts code points after NFKC, as the hash sees them', () => {
    expect(passwordLength('🌊🌊🌊🌊🌊🌊🌊🌊')).toBe(8);
    expect(checkPassword('🌊🌊🌊🌊🌊🌊🌊🐟')).toEqual([]);
    // U+FB01 (the "fi" ligature) is two characters after NFKC
    expect(passwordLength('\uFB01')).toBe(2);
  });

  it('refuses common, repetitive and context-specific passwords, case-insensitively', () => {
    expect(checkPassword('Password1', { isCommon })).toEqual(['common']);
    expect(checkPassword('ILOVEYOU123', { isCommon })).toEqual(['common']);
    expect(checkPassword('aaaaaaaaaa')).toEqual(['repetitive']);
    expect(checkPassword('123456789')).toEqual(['repetitive']);
    expect(checkPassword('hgfedcba')).toEqual(['repetitive']);
    expect(checkPassword('mara.quill-2031', { username: 'mara.quill' })).toEqual([
      'contains-username',
    ]);
    expect(checkPassword('my-Stillwell-pass')).toEqual(['context-word']);
  });

  it('gives a form one issue per broken rule', () => {
    const result = newPasswordSchema({ roles: ['admin'], isCommon }).safeParse('password1');
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.message)).toEqual([
      'at least 15 characters',
      'on the list of commonly used passwords',
    ]);
  });
});
