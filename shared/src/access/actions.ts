import { z } from 'zod';

/**
 * Everything a person can be allowed to do, present and coming. Routes, socket rooms and console
 * screens name one of these; the permission matrix says which roles may.
 */
export const ACTIONS = [
  'telemetry.read',
  'reservoir.read',
  'reservoir.edit',
  'forecast.read',
  'forecast.run',
  'orders.read',
  'orders.draft',
  'orders.authorise',
  'orders.execute',
  'orders.countersign',
  'emergency.declare',
  'automation.edit',
  'logbook.read',
  'logbook.write',
  'logbook.verify',
  'notices.read',
  'notices.manage',
  'notices.send',
  'notices.acknowledge',
  'contacts.manage',
  'alarms.read',
  'alarms.acknowledge',
  'alarms.shelve',
  'limits.edit',
  'replay.read',
  'reports.create',
  'users.manage',
  'backups.manage',
  'sessions.own',
] as const;
export const actionSchema = z.enum(ACTIONS);
export type Action = z.infer<typeof actionSchema>;

export const ACTION_DESCRIPTIONS: Readonly<Record<Action, string>> = {
  'telemetry.read': 'see live and stored readings, status, gaps and quarantine',
  'reservoir.read': "read the reservoir's definition",
  'reservoir.edit': 'change the definition: storage table, outlets, thresholds, zones',
  'forecast.read': 'see forecasts and time left to act',
  'forecast.run': 'run a what-if forecast',
  'orders.read': 'see gate operation orders',
  'orders.draft': 'draft a gate operation',
  'orders.authorise': 'authorise or decline a drafted gate operation (second person)',
  'orders.execute': 'send an authorised gate operation to the gate controller',
  'orders.countersign': 'countersign an emergency action afterwards',
  'emergency.declare': 'declare an emergency (gate operations without the usual second person)',
  'automation.edit': 'change automatic rules',
  'logbook.read': 'read the logbook',
  'logbook.write': 'write in the shift log',
  'logbook.verify': 'verify the logbook chain',
  'notices.read': 'see downstream notices and upcoming releases',
  'notices.manage': 'prepare and edit downstream notices',
  'notices.send': 'send a downstream notice',
  'notices.acknowledge': 'acknowledge a notice received',
  'contacts.manage': 'keep the list of downstream contacts',
  'alarms.read': 'see alarms',
  'alarms.acknowledge': 'acknowledge an alarm',
  'alarms.shelve': 'shelve an alarm',
  'limits.edit':
    'change alarm limits, instrument thresholds and baselines (a new definition version)',
  'replay.read': 'replay a past event',
  'reports.create': 'produce a report',
  'users.manage': 'create users, change roles, disable accounts, reset passwords',
  'backups.manage': 'take an online backup of the database and list the backups',
  'sessions.own': 'see and end your own sessions, change your password and second factor',
};
