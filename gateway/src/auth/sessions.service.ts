import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, IsNull, type EntityManager } from 'typeorm';
import type { SessionInfo } from '@stillwell/shared/access';
import type { Env } from '../config';
import { AccessError } from '../common/errors/access-error';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService } from '../logbook/logbook.service';
import { AccountEvents } from '../users/account-events';
import { UserRow } from '../users/user.entity';
import { rolesOf } from '../users/user-view';
import type { AccessClaims } from './access-tokens';
import { actorOf, type Principal } from './principal';
import { RefreshTokenRow } from './refresh-token.entity';
import { endSessionsOf } from './session-revocation';
import { SessionRow } from './session.entity';

const sha256 = (token: string) => createHash('sha256').update(token).digest('hex');

export interface ClientMeta {
  userAgent: string | null;
  ip: string | null;
}

/** Sessions (refresh-token families): opened at sign-in, rotated on refresh, ended on sign-out. */
@Injectable()
export class SessionsService {
  private readonly logger = new Logger(SessionsService.name);

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly events: AccountEvents,
    private readonly config: ConfigService<Env, true>,
  ) {}

  /** Opens a session inside the caller's sign-in transaction; returns its first refresh token. */
  async open(
    tx: EntityManager,
    userId: string,
    meta: ClientMeta,
  ): Promise<{ session: SessionRow; refreshToken: string }> {
    const now = Date.now();
    const session: SessionRow = Object.assign(new SessionRow(), {
      id: randomUUID(),
      userId,
      createdAt: now,
      lastRefreshedAt: now,
      expiresAt: now + this.config.get('SESSION_MAX_AGE_H', { infer: true }) * 3600_000,
      steppedUpAt: null,
      revokedAt: null,
      revokedReason: null,
      userAgent: meta.userAgent?.slice(0, 256) ?? null,
      ip: meta.ip,
    });
    await tx.insert(SessionRow, session);
    return { session, refreshToken: await this.issueToken(tx, session.id, now) };
  }

  /**
   * Trades a refresh token for a new one in the same family. A token used before means it was
   * copied: the whole family ends (and the logbook says so), the thief's copy and the owner's alike.
   */
  async rotate(
    token: string | undefined,
  ): Promise<{ session: SessionRow; user: UserRow; refreshToken: string }> {
    if (!token || token.length > 200) throw new AccessError('refresh-invalid');
    const outcome = await this.writes.run(() =>
      this.dataSource.transaction(async (tx) => {
        const now = Date.now();
        const row = await tx.findOneBy(RefreshTokenRow, { tokenHash: sha256(token) });
        if (!row) return { kind: 'invalid' as const };
        const session = await tx.findOneBy(SessionRow, { id: row.sessionId });
        if (!session || session.revokedAt !== null || session.expiresAt <= now)
          return { kind: 'invalid' as const };
        const user = await tx.findOneBy(UserRow, { id: session.userId });
        if (!user || user.disabledAt !== null) return { kind: 'invalid' as const };
        if (row.usedAt !== null) {
          await tx.update(
            SessionRow,
            { id: session.id },
            { revokedAt: now, revokedReason: 'refresh-reuse' },
          );
          await this.logbook.append(
            {
              kind: 'auth.refresh-reuse',
              actor: actorOf({ userId: user.id, username: user.username, roles: rolesOf(user) }),
              payload: { sessionId: session.id, tokenUsedAt: new Date(row.usedAt).toISOString() },
            },
            tx,
          );
          return { kind: 'reused' as const, session };
        }
        await tx.update(RefreshTokenRow, { tokenHash: row.tokenHash }, { usedAt: now });
        await tx.update(SessionRow, { id: session.id }, { lastRefreshedAt: now });
        return {
          kind: 'ok' as const,
          session,
          user,
          refreshToken: await this.issueToken(tx, session.id, now),
        };
      }),
    );
    switch (outcome.kind) {
      case 'ok':
        return outcome;
      case 'reused':
        this.logger.warn(
          `Refresh token reused in session ${outcome.session.id}: the session is ended`,
        );
        this.events.ended({
          userId: outcome.session.userId,
          sessionIds: [outcome.session.id],
          reason: 'refresh-reuse',
        });
        throw new AccessError('refresh-invalid');
      case 'invalid':
        throw new AccessError('refresh-invalid');
    }
  }

  /** The principal for an access token: its session must be live and its user enabled, now. */
  async principalFor(claims: AccessClaims): Promise<Principal> {
    const session = await this.dataSource.getRepository(SessionRow).findOneBy({ id: claims.sid });
    const now = Date.now();
    if (
      !session ||
      session.userId !== claims.sub ||
      session.revokedAt !== null ||
      session.expiresAt <= now
    ) {
      throw new AccessError('session-ended');
    }
    const user = await this.dataSource.getRepository(UserRow).findOneBy({ id: session.userId });
    if (!user || user.disabledAt !== null) throw new AccessError('session-ended');
    return {
      userId: user.id,
      username: user.username,
      displayName: user.displayName,
      roles: rolesOf(user),
      sessionId: session.id,
      steppedUpAt: session.steppedUpAt,
      totpEnabled: user.totpSecret !== null,
      mustChangePassword: user.mustChangePassword,
      tokenExpiresAt: claims.exp * 1000,
    };
  }

  async list(userId: string, currentSessionId: string): Promise<SessionInfo[]> {
    const rows = await this.dataSource.getRepository(SessionRow).find({
      where: { userId, revokedAt: IsNull() },
      order: { createdAt: 'DESC' },
    });
    const now = Date.now();
    const iso = (ms: number) => new Date(ms).toISOString();
    return rows
      .filter((s) => s.expiresAt > now)
      .map((s) => ({
        id: s.id,
        createdAt: iso(s.createdAt),
        lastRefreshedAt: iso(s.lastRefreshedAt),
        expiresAt: iso(s.expiresAt),
        userAgent: s.userAgent,
        ip: s.ip,
        current: s.id === currentSessionId,
      }));
  }

  /** Ends one of the principal's own sessions (sign-out when it is the current one). */
  async end(
    principal: Principal,
    sessionId: string,
    kind: 'auth.sign-out' | 'session.revoked',
  ): Promise<void> {
    await this.writes.run(() =>
      this.dataSource.transaction(async (tx) => {
        const session = await tx.findOneBy(SessionRow, {
          id: sessionId,
          userId: principal.userId,
          revokedAt: IsNull(),
        });
        if (!session) throw new AccessError('session-not-found');
        const reason = kind === 'auth.sign-out' ? 'signed-out' : 'ended-by-owner';
        await tx.update(
          SessionRow,
          { id: sessionId },
          { revokedAt: Date.now(), revokedReason: reason },
        );
        await this.logbook.append(
          { kind, actor: actorOf(principal), payload: { sessionId, reason } },
          tx,
        );
      }),
    );
    this.events.ended({ userId: principal.userId, sessionIds: [sessionId], reason: kind });
  }

  /** Ends every other session of the principal's; returns how many. */
  async endOthers(principal: Principal): Promise<number> {
    const ended = await this.writes.run(() =>
      this.dataSource.transaction(async (tx) => {
        const ids = await endSessionsOf(tx, principal.userId, 'ended-by-owner', {
          except: principal.sessionId,
        });
        for (const sessionId of ids) {
          await this.logbook.append(
            {
              kind: 'session.revoked',
              actor: actorOf(principal),
              payload: { sessionId, reason: 'ended-by-owner' },
            },
            tx,
          );
        }
        return ids;
      }),
    );
    if (ended.length)
      this.events.ended({ userId: principal.userId, sessionIds: ended, reason: 'ended-by-owner' });
    return ended.length;
  }

  private async issueToken(tx: EntityManager, sessionId: string, now: number): Promise<string> {
    const token = randomBytes(32).toString('base64url');
    await tx.insert(RefreshTokenRow, {
      tokenHash: sha256(token),
      sessionId,
      issuedAt: now,
      usedAt: null,
    });
    return token;
  }
}
