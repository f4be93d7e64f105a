import { describe, expect, it } from 'vitest';
import { ACTIONS, type Action } from './actions.js';
import { PERMISSIONS, can, permissionTableMarkdown, permissionsOf } from './permissions.js';
import { ROLES, rolesSchema } from './roles.js';

/** Actions that change something; a read-only role must hold none of them. */
const WRITES: readonly Action[] = ACTIONS.filter(
  (a) => !/\.(read|verify)$/.test(a) && a !== 'sessions.own',
);

describe('the permission matrix', () => {
  it('names every action and only known roles', () => {
    expect(Object.keys(PERMISSIONS).sort()).toEqual([...ACTIONS].sort());
    for (const roles of Object.values(PERMISSIONS)) {
      for (const r of roles) expect(ROLES).toContain(r);
      expect(new Set(roles).size).toBe(roles.length);
    }
  });

  it('gives every role its own sessions, and nothing to an empty or unknown role list', () => {
    for (const r of ROLES) expect(can([r], 'sessions.own')).toBe(true);
    expect(permissionsOf([])).toEqual([]);
    expect(permissionsOf(['superuser'])).toEqual([]);
  });

  it('keeps the reviewer read-only and the stakeholder to notices', () => {
    expect(permissionsOf(['reviewer']).filter((a) => WRITES.includes(a))).toEqual([
      'reports.create',
    ]);
    expect(permissionsOf(['stakeholder'])).toEqual([
      'notices.read',
      'notices.acknowledge',
      'sessions.own',
    ]);
  });

  it('keeps the two-person rule possible: who drafts may not authorise by role alone', () => {
    const drafters = PERMISSIONS['orders.draft'];
    const authorisers = PERMISSIONS['orders.authorise'];
    expect(drafters.filter((r) => authorisers.includes(r))).toEqual([]);
    expect(can(['admin'], 'orders.authorise')).toBe(false);
  });

  it('unions the permissions of several roles', () => {
    const both = permissionsOf(['liaison', 'stakeholder']);
    expect(both).toContain('contacts.manage');
    expect(both).toContain('notices.acknowledge');
  });

  it('prints one table row per action with a column per role', () => {
    const lines = permissionTableMarkdown().split('\n');
    expect(lines).toHaveLength(ACTIONS.length + 2);
    expect(lines[0]).toBe(`| action | ${ROLES.join(' | ')} |`);
    expect(lines.find((l) => l.startsWith('| `users.manage`'))).toBe(
      '| `users.manage` |  |  |  |  |  | yes |',
    );
  });

  it('refuses an empty or repeated role list', () => {
    expect(rolesSchema.safeParse([]).success).toBe(false);
    expect(rolesSchema.safeParse(['operator', 'operator']).success).toBe(false);
    expect(rolesSchema.safeParse(['operator', 'root']).success).toBe(false);
  });
});
