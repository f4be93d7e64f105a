import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import type { CreateUserRequest, Role, UpdateUserRequest } from '@stillwell/shared/access';
import { endSessionsOf } from '../auth/session-revocation';
import { AccessError } from '../common/errors/access-error';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { AccountEvents } from './account-events';
import { PasswordService } from './password.service';
import { UserRow } from './user.entity';
import { rolesOf } from './user-view';

const isEnabledAdmin = (u: UserRow) => u.disabledAt === null && rolesOf(u).includes('admin');

export interface NewAccount {
  username: string;
  displayName: string;
  roles: Role[];
  /** given: used as it is (after the rules); absent: a temporary one is made and must be changed */
  password?: string;
  /** the given password's hash, when the caller made it already */
  passwordHash?: string;
}

/** Accounts: every change in one transaction with its logbook entry. */
@Injectable()
export class UsersService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly passwords: PasswordService,
    private readonly events: AccountEvents,
  ) {}

  private get repo() {
    return this.dataSource.getRepository(UserRow);
  }

  findByUsername(username: string): Promise<UserRow | null> {
    return this.repo.findOneBy({ username: username.normalize('NFKC').trim().toLowerCase() });
  }

  findById(id: string): Promise<UserRow | null> {
    return this.repo.findOneBy({ id });
  }

  list(): Promise<UserRow[]> {
    return this.repo.find({ order: { username: 'ASC' } });
  }

  /** Runs a write job in one transaction, behind the one write queue. */
  transaction<T>(job: (tx: EntityManager) => Promise<T>): Promise<T> {
    return this.writes.run(() => this.dataSource.transaction(job));
  }

  async create(
    account: NewAccount | CreateUserRequest,
    actor: LogbookActor | null,
    via: string,
  ): Promise<{ user: UserRow; temporaryPassword?: string }> {
    const given = 'password' in account ? account.password : undefined;
    const password = given ?? this.passwords.temporary(account);
    this.passwords.assertAcceptable(password, account);
    const passwordHash =
      ('passwordHash' in account ? account.passwordHash : undefined) ??
      (await this.passwords.hash(password));
    const user = await this.transaction(async (tx) => {
      if (await tx.findOneBy(UserRow, { username: account.username }))
        throw new AccessError('username-taken');
      const row = this.newRow(account, passwordHash, given === undefined);
      await tx.insert(UserRow, row);
      await this.logbook.append(
        {
          kind: 'user.created',
          actor,
          payload: {
            userId: row.id,
            username: row.username,
            displayName: row.displayName,
            roles: account.roles,
            via,
          },
        },
        tx,
      );
      return row;
    });
    return given === undefined ? { user, temporaryPassword: password } : { user };
  }

  /** The setup command: the first administrator, refused once any administrator exists. */
  async createFirstAdmin(
    account: Omit<NewAccount, 'roles'> & { password: string },
  ): Promise<UserRow> {
    const roles: Role[] = ['admin'];
    this.passwords.assertAcceptable(account.password, { ...account, roles });
    const passwordHash = await this.passwords.hash(account.password);
    return this.transaction(async (tx) => {
      const all = await tx.find(UserRow);
      if (all.some((u) => rolesOf(u).includes('admin'))) throw new AccessError('admin-exists');
      if (all.some((u) => u.username === account.username)) throw new AccessError('username-taken');
      const row = this.newRow({ ...account, roles }, passwordHash, false);
      await tx.insert(UserRow, row);
      await this.logbook.append(
        {
          kind: 'user.created',
          actor: null,
          payload: {
            userId: row.id,
            username: row.username,
            displayName: row.displayName,
            roles,
            via: 'setup-command',
          },
        },
        tx,
      );
      return row;
    });
  }

  async update(id: string, change: UpdateUserRequest, actor: LogbookActor): Promise<UserRow> {
    const result = await this.transaction(async (tx) => {
      const all = await tx.find(UserRow);
      const row = all.find((u) => u.id === id);
      if (!row) throw new AccessError('user-not-found');
      const before = {
        roles: rolesOf(row),
        disabled: row.disabledAt !== null,
        displayName: row.displayName,
      };
      const now = Date.now();
      if (change.roles) row.roles = JSON.stringify(change.roles);
      if (change.displayName !== undefined) row.displayName = change.displayName;
      if (change.disabled !== undefined)
        row.disabledAt = change.disabled ? (row.disabledAt ?? now) : null;
      if (!all.some(isEnabledAdmin)) throw new AccessError('last-admin');
      row.updatedAt = now;
      await tx.save(UserRow, row);

      const target = { userId: row.id, username: row.username };
      const log = (kind: string, payload: Record<string, unknown>) =>
        this.logbook.append({ kind, actor, payload: { ...target, ...payload } }, tx);
      let ended: string[] = [];
      const rolesNow = rolesOf(row);
      if (change.roles && before.roles.join() !== rolesNow.join()) {
        await log('user.roles-changed', { from: before.roles, to: rolesNow });
      }
      if (change.displayName !== undefined && before.displayName !== row.displayName) {
        await log('user.profile-changed', {
          displayNameFrom: before.displayName,
          displayNameTo: row.displayName,
        });
      }
      if (change.disabled === true && !before.disabled) {
        ended = await endSessionsOf(tx, row.id, 'user-disabled', { now });
        await log('user.disabled', { sessionsEnded: ended.length });
      }
      if (change.disabled === false && before.disabled) await log('user.enabled', {});
      const rolesChanged = before.roles.join() !== rolesNow.join();
      return { row, ended, rolesChanged };
    });
    if (result.ended.length || result.rolesChanged) {
      // sockets carry the roles they were opened with: close them so they reconnect afresh
      this.events.ended({
        userId: id,
        reason: result.ended.length ? 'user-disabled' : 'roles-changed',
      });
    }
    return result.row;
  }

  /** An administrator's reset: a temporary password to change at next sign-in, every session ended. */
  async resetPassword(
    id: string,
    options: { removeTotp?: boolean },
    actor: LogbookActor,
  ): Promise<string> {
    const row = await this.findById(id);
    if (!row) throw new AccessError('user-not-found');
    const temporary = this.passwords.temporary({ username: row.username, roles: rolesOf(row) });
    const passwordHash = await this.passwords.hash(temporary);
    await this.transaction(async (tx) => {
      const now = Date.now();
      const totpRemoved = Boolean(options.removeTotp && row.totpSecret);
      await tx.update(
        UserRow,
        { id },
        {
          passwordHash,
          passwordChangedAt: now,
          mustChangePassword: true,
          updatedAt: now,
          ...(options.removeTotp
            ? { totpSecret: null, totpPendingSecret: null, totpLastStep: null }
            : {}),
        },
      );
      const ended = await endSessionsOf(tx, id, 'password-reset', { now });
      const target = { userId: id, username: row.username };
      await this.logbook.append(
        { kind: 'user.password-reset', actor, payload: { ...target, sessionsEnded: ended.length } },
        tx,
      );
      if (totpRemoved) {
        await this.logbook.append(
          { kind: 'user.totp-removed', actor, payload: { ...target, by: 'administrator' } },
          tx,
        );
      }
    });
    this.events.ended({ userId: id, reason: 'password-reset' });
    return temporary;
  }

  /** One's own display name (the only profile field a user sets: roles are an administrator's). */
  async rename(actor: LogbookActor, displayName: string): Promise<void> {
    await this.transaction(async (tx) => {
      const row = await tx.findOneBy(UserRow, { id: actor.userId });
      if (!row) throw new AccessError('user-not-found');
      if (row.displayName === displayName) return;
      await tx.update(UserRow, { id: row.id }, { displayName, updatedAt: Date.now() });
      await this.logbook.append(
        {
          kind: 'user.profile-changed',
          actor,
          payload: {
            userId: row.id,
            username: row.username,
            displayNameFrom: row.displayName,
            displayNameTo: displayName,
          },
        },
        tx,
      );
    });
  }

  /** Signs a user out everywhere; the account stays enabled. */
  async endSessions(id: string, actor: LogbookActor): Promise<number> {
    const ended = await this.transaction(async (tx) => {
      const row = await tx.findOneBy(UserRow, { id });
      if (!row) throw new AccessError('user-not-found');
      const ids = await endSessionsOf(tx, id, 'ended-by-administrator');
      for (const sessionId of ids) {
        await this.logbook.append(
          {
            kind: 'session.revoked',
            actor,
            payload: {
              userId: id,
              username: row.username,
              sessionId,
              reason: 'ended-by-administrator',
            },
          },
          tx,
        );
      }
      return ids;
    });
    if (ended.length)
      this.events.ended({ userId: id, sessionIds: ended, reason: 'ended-by-administrator' });
    return ended.length;
  }

  private newRow(
    account: Pick<NewAccount, 'username' | 'displayName' | 'roles'>,
    passwordHash: string,
    mustChange: boolean,
  ): UserRow {
    const now = Date.now();
    return Object.assign(new UserRow(), {
      id: randomUUID(),
      username: account.username,
      displayName: account.displayName,
      roles: JSON.stringify(account.roles),
      passwordHash,
      passwordChangedAt: now,
      mustChangePassword: mustChange,
      disabledAt: null,
      totpSecret: null,
      totpPendingSecret: null,
      totpLastStep: null,
      createdAt: now,
      updatedAt: now,
    });
  }
}
