import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import {
  permissionsOf,
  type Me,
  type SignInRequest,
  type StepUpRequest,
} from '@stillwell/shared/access';
import type { Env } from '../config';
import { AccessError } from '../common/errors/access-error';
import { LogbookService } from '../logbook/logbook.service';
import { AccountEvents } from '../users/account-events';
import { PasswordService } from '../users/password.service';
import { UserRow } from '../users/user.entity';
import { rolesOf } from '../users/user-view';
import { UsersService } from '../users/users.service';
import { AccessTokens } from './access-tokens';
import { FailureDelay } from './failure-delay';
import { actorOf, type Principal } from './principal';
import { endSessionsOf } from './session-revocation';
import { SessionRow } from './session.entity';
import { SessionsService, type ClientMeta } from './sessions.service';
import { acceptTotp } from './totp';

export interface SignedIn {
  accessToken: string;
  expiresAt: number;
  refreshToken: string;
  sessionExpiresAt: number;
  principal: Principal;
}

const actorOfRow = (u: UserRow) =>
  actorOf({ userId: u.id, username: u.username, roles: rolesOf(u) });
const normalizeUsername = (u: string) => u.normalize('NFKC').trim().toLowerCase();

/** Sign-in, step-up and password change: every one checks the password the same careful way. */
@Injectable()
export class AuthService {
  private readonly delay: FailureDelay;
  private readonly stepUpTtlMs: number;

  constructor(
    config: ConfigService<Env, true>,
    private readonly users: UsersService,
    private readonly passwords: PasswordService,
    private readonly sessions: SessionsService,
    private readonly tokens: AccessTokens,
    private readonly logbook: LogbookService,
    private readonly events: AccountEvents,
  ) {
    this.delay = new FailureDelay({
      freeFailures: config.get('SIGN_IN_FREE_FAILURES', { infer: true }),
      firstDelayS: config.get('SIGN_IN_FIRST_DELAY_S', { infer: true }),
      maxDelayS: config.get('SIGN_IN_MAX_DELAY_S', { infer: true }),
    });
    this.stepUpTtlMs = config.get('STEP_UP_TTL_S', { infer: true }) * 1000;
  }

  /**
   * Same answer, and the same scrypt work, whether the username exists or not; a disabled account
   * answers like a wrong password. The second factor is asked for only after a right password.
   */
  async signIn(body: SignInRequest, meta: ClientMeta): Promise<SignedIn> {
    const key = normalizeUsername(body.username);
    this.assertNotDelayed(key);
    const user = key.length <= 64 ? await this.users.findByUsername(key) : null;
    const passwordOk = await this.passwords.verify(body.password, user?.passwordHash ?? null);
    if (!user || !passwordOk || user.disabledAt !== null) {
      const reason = !user ? 'unknown-account' : !passwordOk ? 'wrong-password' : 'disabled';
      return this.failSignIn(key, user, reason, meta, 'invalid-credentials');
    }
    let step: number | null = null;
    if (user.totpSecret) {
      if (!body.totp) throw new AccessError('totp-required');
      step = acceptTotp(user.totpSecret, body.totp, Date.now(), user.totpLastStep);
      if (step === null) return this.failSignIn(key, user, 'wrong-totp', meta, 'totp-invalid');
    }
    this.delay.succeeded(key);
    const rehash = this.passwords.hasher.needsRehash(user.passwordHash)
      ? await this.passwords.hash(body.password)
      : null;
    const { session, refreshToken } = await this.users.transaction(async (tx) => {
      const opened = await this.sessions.open(tx, user.id, meta);
      if (step !== null) await tx.update(UserRow, { id: user.id }, { totpLastStep: step });
      if (rehash) await tx.update(UserRow, { id: user.id }, { passwordHash: rehash });
      await this.logbook.append(
        {
          kind: 'auth.sign-in',
          actor: actorOfRow(user),
          payload: {
            sessionId: opened.session.id,
            secondFactor: step !== null,
            ip: meta.ip,
            userAgent: meta.userAgent,
          },
        },
        tx,
      );
      return opened;
    });
    return this.signedIn(session, refreshToken);
  }

  async refresh(refreshToken: string | undefined): Promise<SignedIn> {
    const rotated = await this.sessions.rotate(refreshToken);
    return this.signedIn(rotated.session, rotated.refreshToken);
  }

  /** The password (and code) again: authorising and overriding actions accept the session for a while. */
  async stepUp(principal: Principal, body: StepUpRequest): Promise<number> {
    const user = await this.reconfirm(principal, body.password, body.totp, 'auth.step-up');
    const now = Date.now();
    await this.users.transaction(async (tx) => {
      await tx.update(SessionRow, { id: principal.sessionId }, { steppedUpAt: now });
      if (user.step !== null)
        await tx.update(UserRow, { id: principal.userId }, { totpLastStep: user.step });
      await this.logbook.append(
        {
          kind: 'auth.step-up',
          actor: actorOf(principal),
          payload: { ok: true, sessionId: principal.sessionId, secondFactor: user.step !== null },
        },
        tx,
      );
    });
    return now + this.stepUpTtlMs;
  }

  /** Changes one's own password; every other session ends. */
  async changePassword(
    principal: Principal,
    currentPassword: string,
    newPassword: string,
  ): Promise<void> {
    await this.reconfirm(principal, currentPassword, undefined, 'user.password-changed');
    this.passwords.assertAcceptable(newPassword, principal);
    const hash = await this.passwords.hash(newPassword);
    const ended = await this.users.transaction(async (tx) => {
      const now = Date.now();
      await tx.update(
        UserRow,
        { id: principal.userId },
        { passwordHash: hash, passwordChangedAt: now, mustChangePassword: false, updatedAt: now },
      );
      const ids = await endSessionsOf(tx, principal.userId, 'password-changed', {
        except: principal.sessionId,
        now,
      });
      await this.logbook.append(
        {
          kind: 'user.password-changed',
          actor: actorOf(principal),
          payload: { userId: principal.userId, sessionsEnded: ids.length },
        },
        tx,
      );
      return ids;
    });
    if (ended.length)
      this.events.ended({
        userId: principal.userId,
        sessionIds: ended,
        reason: 'password-changed',
      });
  }

  me(p: Principal): Me {
    return {
      id: p.userId,
      username: p.username,
      displayName: p.displayName,
      roles: p.roles,
      permissions: permissionsOf(p.roles),
      sessionId: p.sessionId,
      stepUpUntil: this.stepUpValid(p)
        ? new Date(p.steppedUpAt! + this.stepUpTtlMs).toISOString()
        : null,
      totpEnabled: p.totpEnabled,
      mustChangePassword: p.mustChangePassword,
    };
  }

  stepUpValid(p: Principal, now = Date.now()): boolean {
    return p.steppedUpAt !== null && now - p.steppedUpAt <= this.stepUpTtlMs;
  }

  /** Password (and code, where enabled) of a signed-in user, counted like sign-in failures. */
  private async reconfirm(
    principal: Principal,
    password: string,
    totp: string | undefined,
    kind: string,
  ): Promise<{ step: number | null }> {
    this.assertNotDelayed(principal.username);
    const user = await this.users.findById(principal.userId);
    if (!user) throw new AccessError('session-ended');
    const fail = async (code: 'wrong-password' | 'wrong-totp'): Promise<never> => {
      const blockedForS = this.delay.failed(principal.username);
      await this.logbook.append({
        kind,
        actor: actorOf(principal),
        payload: { ok: false, reason: code, sessionId: principal.sessionId, blockedForS },
      });
      throw new AccessError(code);
    };
    if (!(await this.passwords.verify(password, user.passwordHash))) return fail('wrong-password');
    let step: number | null = null;
    if (user.totpSecret && kind === 'auth.step-up') {
      step = totp ? acceptTotp(user.totpSecret, totp, Date.now(), user.totpLastStep) : null;
      if (step === null) return fail('wrong-totp');
    }
    this.delay.succeeded(principal.username);
    return { step };
  }

  private assertNotDelayed(key: string): void {
    const retryAfterS = this.delay.retryAfterS(key);
    if (retryAfterS > 0) throw new AccessError('too-many-attempts', { retryAfterS });
  }

  private async failSignIn(
    key: string,
    user: UserRow | null,
    reason: string,
    meta: ClientMeta,
    code: 'invalid-credentials' | 'totp-invalid',
  ): Promise<never> {
    const blockedForS = this.delay.failed(key);
    // What was typed as a username is logged only when it is one: it may be a password typed in
    // the wrong field, and the logbook keeps everything for ever.
    await this.logbook.append({
      kind: 'auth.sign-in-failed',
      actor: user ? actorOfRow(user) : null,
      payload: {
        username: user?.username ?? null,
        unknownAccount: !user,
        reason,
        ip: meta.ip,
        blockedForS,
      },
    });
    throw new AccessError(code);
  }

  private async signedIn(session: SessionRow, refreshToken: string): Promise<SignedIn> {
    const { token, expiresAt } = await this.tokens.issue(session.userId, session.id);
    const principal = await this.sessions.principalFor({
      sub: session.userId,
      sid: session.id,
      iat: 0,
      exp: expiresAt / 1000,
    });
    return {
      accessToken: token,
      expiresAt,
      refreshToken,
      sessionExpiresAt: session.expiresAt,
      principal,
    };
  }
}
