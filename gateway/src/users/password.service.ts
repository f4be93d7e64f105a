import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { checkPassword, type Role } from '@stillwell/shared/access';
import type { Env } from '../config';
import { AccessError } from '../common/errors/access-error';
import { isCommonPassword } from './common-passwords';
import { passphrase } from './passphrase';
import { PasswordHasher } from './password-hasher';

/** Hashing with today's parameters, and the password rules with the shipped common list. */
@Injectable()
export class PasswordService {
  readonly hasher: PasswordHasher;

  constructor(config: ConfigService<Env, true>) {
    this.hasher = new PasswordHasher({
      N: config.get('PASSWORD_SCRYPT_N', { infer: true }),
      r: 8,
      p: 1,
    });
  }

  /** Throws password-rejected with the broken rules. */
  assertAcceptable(password: string, account: { username: string; roles: readonly Role[] }): void {
    const problems = checkPassword(password, { ...account, isCommon: isCommonPassword });
    if (problems.length) throw new AccessError('password-rejected', { problems });
  }

  /** A temporary password that passes the rules for these roles (admins need 15 characters). */
  temporary(account: { username: string; roles: readonly Role[] }): string {
    for (;;) {
      const candidate = passphrase(4);
      if (!checkPassword(candidate, { ...account, isCommon: isCommonPassword }).length)
        return candidate;
    }
  }

  hash(password: string): Promise<string> {
    return this.hasher.hash(password);
  }

  verify(password: string, encoded: string | null): Promise<boolean> {
    return this.hasher.verify(password, encoded);
  }
}
