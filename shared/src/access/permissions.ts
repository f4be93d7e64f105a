import { ACTIONS, type Action } from './actions.js';
import { ROLES, type Role } from './roles.js';

/**
 * THE permission matrix: for each action, the roles that may perform it. The gateway's guards,
 * the socket rooms and the console read this and nothing else; docs/security.md prints it
 * (a test keeps the two the same). Least privilege: a role gets what its job needs.
 */
export const PERMISSIONS: Readonly<Record<Action, readonly Role[]>> = {
  'telemetry.read': ['operator', 'engineer', 'liaison', 'reviewer', 'admin'],
  'reservoir.read': ['operator', 'engineer', 'liaison', 'reviewer', 'admin'],
  'reservoir.edit': ['admin'],
  'forecast.read': ['operator', 'engineer', 'liaison', 'reviewer'],
  'forecast.run': ['operator', 'engineer'],
  'orders.read': ['operator', 'engineer', 'liaison', 'reviewer'],
  'orders.draft': ['operator'],
  'orders.authorise': ['engineer'],
  'orders.execute': ['operator'],
  'orders.countersign': ['engineer'],
  'emergency.declare': ['operator', 'engineer'],
  'automation.edit': ['engineer'],
  'logbook.read': ['operator', 'engineer', 'liaison', 'reviewer', 'admin'],
  'logbook.write': ['operator', 'engineer', 'liaison'],
  'logbook.verify': ['operator', 'engineer', 'liaison', 'reviewer', 'admin'],
  'notices.read': ['operator', 'engineer', 'liaison', 'stakeholder', 'reviewer'],
  'notices.manage': ['liaison', 'engineer'],
  'notices.send': ['liaison', 'engineer'],
  'notices.acknowledge': ['stakeholder'],
  'contacts.manage': ['liaison'],
  'alarms.read': ['operator', 'engineer', 'liaison', 'reviewer'],
  'alarms.acknowledge': ['operator', 'engineer'],
  'alarms.shelve': ['engineer'],
  'limits.edit': ['engineer'],
  'replay.read': ['operator', 'engineer', 'reviewer'],
  'reports.create': ['engineer', 'reviewer'],
  'users.manage': ['admin'],
  'backups.manage': ['admin'],
  'sessions.own': ['operator', 'engineer', 'liaison', 'stakeholder', 'reviewer', 'admin'],
};

/** May someone holding these roles perform this action? Unknown roles grant nothing. */
export function can(roles: readonly string[], action: Action): boolean {
  const allowed: readonly string[] = PERMISSIONS[action];
  return roles.some((r) => allowed.includes(r));
}

/** Every action these roles allow, in the matrix's order (the console hides what is not there). */
export function permissionsOf(roles: readonly string[]): Action[] {
  return ACTIONS.filter((a) => can(roles, a));
}

/** The matrix as rows of [action, role -> allowed], in a fixed order, for tables and docs. */
export function permissionRows(): Array<{ action: Action; allowed: Record<Role, boolean> }> {
  return ACTIONS.map((action) => ({
    action,
    allowed: Object.fromEntries(ROLES.map((r) => [r, PERMISSIONS[action].includes(r)])) as Record<
      Role,
      boolean
    >,
  }));
}

/** The matrix as a Markdown table (docs/security.md holds exactly this; a test compares them). */
export function permissionTableMarkdown(): string {
  const header = `| action | ${ROLES.join(' | ')} |`;
  const rule = `|---|${ROLES.map(() => ':-:').join('|')}|`;
  const rows = permissionRows().map(
    ({ action, allowed }) =>
      `| \`${action}\` | ${ROLES.map((r) => (allowed[r] ? 'yes' : '')).join(' | ')} |`,
  );
  return [header, rule, ...rows].join('\n');
}
