import { Injectable, Logger, OnApplicationBootstrap } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { Role } from '@stillwell/shared/access';
import { endSessionsOf } from '../auth/session-revocation';
import type { Env } from '../config';
import { LogbookService } from '../logbook/logbook.service';
import { PasswordService } from './password.service';
import { UserRow } from './user.entity';
import { UsersService } from './users.service';

/** One invented person per role; the username is the role, for an easy demo. */
export const DEMO_PEOPLE: ReadonlyArray<{ role: Role; displayName: string }> = [
  { role: 'operator', displayName: 'Mara Quill (operator on shift)' },
  { role: 'engineer', displayName: 'Tobin Hale (duty engineer)' },
  { role: 'liaison', displayName: 'Ines Varga (downstream liaison)' },
  { role: 'stakeholder', displayName: 'Dorran Pike (Hessford emergency management)' },
  { role: 'reviewer', displayName: 'Odile Brandt (dam safety reviewer)' },
  { role: 'admin', displayName: 'Sefton Marr (administrator)' },
];

/**
 * Demo mode only: makes sure each demo account exists and gives it a fresh random password at every
 * start, printed once in a block. Outside demo mode there is no account and no password until the
 * setup command (dist/cli/create-admin.js) creates the first administrator.
 */
@Injectable()
export class DemoUsersSeeder implements OnApplicationBootstrap {
  private readonly logger = new Logger('DemoUsers');
  /** this start's passwords, in memory only (the integration tests sign in with them) */
  readonly credentials = new Map<Role, { username: string; password: string }>();

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly users: UsersService,
    private readonly passwords: PasswordService,
    private readonly logbook: LogbookService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    if (!this.config.get('DEMO_MODE', { infer: true })) return;
    const fresh = await Promise.all(
      DEMO_PEOPLE.map(async (p) => {
        const account = { username: p.role, displayName: p.displayName, roles: [p.role] };
        const password = this.passwords.temporary(account);
        return { ...account, role: p.role, password, hash: await this.passwords.hash(password) };
      }),
    );
    await this.users.transaction(async (tx) => {
      for (const a of fresh) {
        const existing = await tx.findOneBy(UserRow, { username: a.username });
        if (existing) {
          const now = Date.now();
          await tx.update(
            UserRow,
            { id: existing.id },
            {
              passwordHash: a.hash,
              passwordChangedAt: now,
              mustChangePassword: false,
              updatedAt: now,
            },
          );
          await endSessionsOf(tx, existing.id, 'demo-restart', { now });
          await this.logbook.append(
            {
              kind: 'user.password-reset',
              actor: null,
              payload: { userId: existing.id, username: a.username, via: 'demo-start' },
            },
            tx,
          );
        }
      }
    });
    for (const a of fresh) {
      if (!(await this.users.findByUsername(a.username))) {
        const { username, displayName, roles, password, hash } = a;
        await this.users.create(
          { username, displayName, roles, password, passwordHash: hash },
          null,
          'demo-seed',
        );
      }
      this.credentials.set(a.role, { username: a.username, password: a.password });
    }
    const width = Math.max(...fresh.map((a) => a.username.length));
    const pwWidth = Math.max(...fresh.map((a) => a.password.length));
    this.logger.log(
      [
        '',
        '================ DEMO MODE: sign-in accounts (new passwords at every start) ================',
        ...fresh.map(
          (a) => `  ${a.username.padEnd(width)}  ${a.password.padEnd(pwWidth)}  ${a.displayName}`,
        ),
        '  Demo mode only. Outside demo mode: node gateway/dist/cli/create-admin.js --username ...',
        '=============================================================================================',
      ].join('\n'),
    );
  }
}
