import { z } from 'zod';

/** Every role a user can hold; a user holds one or more. */
export const ROLES = [
  'operator',
  'engineer',
  'liaison',
  'stakeholder',
  'reviewer',
  'admin',
] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

/** What each role is for, in the words the console shows beside it. */
export const ROLE_LABELS: Readonly<Record<Role, { title: string; description: string }>> = {
  operator: {
    title: 'Operator',
    description:
      'On shift: watches the reservoir, drafts gate operations, acknowledges alarms, keeps the shift log',
  },
  engineer: {
    title: 'Duty engineer',
    description: 'Reviews and authorises gate operations, countersigns emergency actions',
  },
  liaison: {
    title: 'Downstream liaison',
    description: 'Keeps the downstream contacts and makes sure every one is told before a release',
  },
  stakeholder: {
    title: 'Downstream stakeholder',
    description: 'An outside contact: sees upcoming releases and acknowledges notices',
  },
  reviewer: {
    title: 'Reviewer',
    description: 'Read-only: replays events, verifies the logbook, produces reports',
  },
  admin: {
    title: 'Administrator',
    description: "Users and roles, the reservoir's definition and thresholds",
  },
};

/** A user's roles: at least one, no repeats. */
export const rolesSchema = z
  .array(roleSchema)
  .min(1, 'at least one role')
  .max(ROLES.length)
  .refine((roles) => new Set(roles).size === roles.length, 'a role is listed twice');
