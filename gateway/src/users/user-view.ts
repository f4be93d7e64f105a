import type { Role, User } from '@stillwell/shared/access';
import type { UserRow } from './user.entity';

export function rolesOf(row: UserRow): Role[] {
  return JSON.parse(row.roles) as Role[];
}

const iso = (ms: number) => new Date(ms).toISOString();

/** An account as an administrator sees it (never a hash or a second-factor key). */
export function toUserView(row: UserRow): User {
  return {
    id: row.id,
    username: row.username,
    displayName: row.displayName,
    roles: rolesOf(row),
    disabled: row.disabledAt !== null,
    totpEnabled: row.totpSecret !== null,
    mustChangePassword: row.mustChangePassword,
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
    passwordChangedAt: iso(row.passwordChangedAt),
  };
}
