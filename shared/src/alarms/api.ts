import { z } from 'zod';
import { UNITS } from '../units/units.js';
import { CONDITION_KINDS, CONDITION_SOURCES, alarmConditionSchema } from './conditions.js';
import { DISPLAY_STATES, HANDLINGS } from './lifecycle.js';
import { PRIORITIES, priorityRank, prioritySchema, type Priority } from './priorities.js';

/** Shapes the gateway serves and the console reads. Times are site time, epoch ms, unless named. */

export const alarmViewSchema = z.strictObject({
  reservoirId: z.string(),
  conditionId: z.string(),
  kind: z.enum(CONDITION_KINDS),
  label: z.string(),
  priority: prioritySchema,
  source: z.enum(CONDITION_SOURCES),
  state: z.enum(DISPLAY_STATES),
  active: z.boolean(),
  acknowledged: z.boolean(),
  handling: z.enum(HANDLINGS),
  shelvedUntilMs: z.number().nullable(),
  /** why it is shelved or out of service */
  reason: z.string().nullable(),
  /** who shelved it or took it out of service */
  handledBy: z.string().nullable(),
  raisedAtMs: z.number().nullable(),
  clearedAtMs: z.number().nullable(),
  acknowledgedAtMs: z.number().nullable(),
  acknowledgedBy: z.string().nullable(),
  /** the value and limit when it last changed, and what was said about it */
  value: z.number().nullable(),
  limit: z.number().nullable(),
  unit: z.enum(UNITS).nullable(),
  message: z.string(),
  lastChangeMs: z.number(),
  /** how many times it has been raised */
  activations: z.number().int(),
});
export type AlarmView = z.infer<typeof alarmViewSchema>;

export const priorityCountSchema = z.strictObject({
  /** in service and not at rest: active, or cleared but not yet acknowledged */
  total: z.number().int(),
  unacknowledged: z.number().int(),
});

export const alarmCountsSchema = z.strictObject({
  byPriority: z.record(prioritySchema, priorityCountSchema),
  shelved: z.number().int(),
  outOfService: z.number().int(),
});
export type AlarmCounts = z.infer<typeof alarmCountsSchema>;

/** GET /api/reservoirs/:id/alarms: the operator's list, in the order to show it. */
export const alarmListSchema = z.strictObject({
  reservoirId: z.string(),
  siteNowMs: z.number(),
  alarms: z.array(alarmViewSchema),
  counts: alarmCountsSchema,
});
export type AlarmList = z.infer<typeof alarmListSchema>;

export const ALARM_EVENT_KINDS = [
  'raised',
  'cleared',
  'acknowledged',
  'shelved',
  'shelf-expired',
  'removed-from-service',
  'returned-to-service',
] as const;
export type AlarmEventKind = (typeof ALARM_EVENT_KINDS)[number];

export const alarmEventSchema = z.strictObject({
  id: z.number().int(),
  reservoirId: z.string(),
  conditionId: z.string(),
  kind: z.enum(ALARM_EVENT_KINDS),
  siteTimeMs: z.number(),
  priority: prioritySchema,
  /** raised while in service: presented to the operator (counts in the alarm rate) */
  annunciated: z.boolean(),
  /** the person; null for the system */
  actor: z.string().nullable(),
  /** the comment or reason given, or what the condition said */
  text: z.string().nullable(),
  value: z.number().nullable(),
  /** the logbook entry that records it, for people's actions */
  logbookSeq: z.number().int().nullable(),
});
export type AlarmEvent = z.infer<typeof alarmEventSchema>;

export const alarmHistorySchema = z.strictObject({
  condition: alarmConditionSchema,
  alarm: alarmViewSchema.nullable(),
  events: z.array(alarmEventSchema),
});
export type AlarmHistory = z.infer<typeof alarmHistorySchema>;

export const alarmEventListSchema = z.strictObject({
  events: z.array(alarmEventSchema),
  truncated: z.boolean(),
});
export type AlarmEventList = z.infer<typeof alarmEventListSchema>;

export const alarmConditionListSchema = z.strictObject({
  definitionVersion: z.number().int(),
  conditions: z.array(alarmConditionSchema),
});
export type AlarmConditionList = z.infer<typeof alarmConditionListSchema>;

export const COMMENT_MAX = 500;

export const acknowledgeRequestSchema = z.strictObject({
  comment: z.string().max(COMMENT_MAX).optional(),
});
export const shelveRequestSchema = z.strictObject({
  reason: z.string().max(COMMENT_MAX),
  /** site seconds from now */
  durationS: z.number().positive(),
});
export const outOfServiceRequestSchema = z.strictObject({ reason: z.string().max(COMMENT_MAX) });
export const returnRequestSchema = z.strictObject({
  comment: z.string().max(COMMENT_MAX).optional(),
});

/** The shelf lengths the console offers, site seconds (each within the default maximum). */
export const SHELVE_CHOICES_S = [1800, 3600, 4 * 3600, 8 * 3600] as const;

/**
 * The list order: unacknowledged first (they ask for attention), then by priority, then the most
 * recent; shelved and out-of-service alarms last, as they ask nothing of the operator now.
 */
export function compareAlarms(a: AlarmView, b: AlarmView): number {
  const away = (x: AlarmView) => (x.handling === 'in-service' ? 0 : 1);
  return (
    away(a) - away(b) ||
    Number(a.acknowledged) - Number(b.acknowledged) ||
    priorityRank(a.priority) - priorityRank(b.priority) ||
    (b.raisedAtMs ?? b.lastChangeMs) - (a.raisedAtMs ?? a.lastChangeMs) ||
    a.conditionId.localeCompare(b.conditionId)
  );
}

/** Counts by priority of the alarms in service, for the banner. */
export function countAlarms(alarms: readonly AlarmView[]): AlarmCounts {
  const byPriority = Object.fromEntries(
    PRIORITIES.map((p) => [p, { total: 0, unacknowledged: 0 }]),
  ) as Record<Priority, { total: number; unacknowledged: number }>;
  let shelved = 0;
  let outOfService = 0;
  for (const a of alarms) {
    if (a.handling === 'shelved') shelved++;
    else if (a.handling === 'out-of-service') outOfService++;
    else if (a.state !== 'normal') {
      byPriority[a.priority].total++;
      if (!a.acknowledged) byPriority[a.priority].unacknowledged++;
    }
  }
  return { byPriority, shelved, outOfService };
}

/**
 * Live push of alarms on the /live namespace: after subscribing, a console gets the reservoir's whole list
 * (the same shape as GET /api/reservoirs/:id/alarms) at once and again whenever any alarm of it changes.
 */
export const ALARM_LIVE_EVENTS = {
  /** client -> server: { reservoirId }, answered by an ack { ok, error? }; needs alarms.read */
  subscribe: 'alarms-subscribe',
  unsubscribe: 'alarms-unsubscribe',
  /** server -> client: AlarmList */
  list: 'alarm-list',
} as const;
