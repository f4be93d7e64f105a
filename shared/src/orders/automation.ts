import { z } from 'zod';
import { idSchema } from '../telemetry/message.js';
import { isTopicSegment, TOPIC_ROOT } from '../telemetry/topics.js';
import { personSchema } from './api.js';

/**
 * Automatic rules: a gate or the outlet valve opens by itself to a set target when the pool rises
 * past a set elevation. The controller in the field evaluates them (it must act even when the
 * gateway or its link is down); the gateway configures them and records what they do.
 *
 *   stillwell/v1/{reservoirId}/rules/{deviceId}         gateway -> controller, QoS 1, retained:
 *                                                       the whole rule set (RuleSetMessage)
 *   stillwell/v1/{reservoirId}/rule-events/{deviceId}   controller -> gateway, QoS 1:
 *                                                       applied / rejected / triggered / rearmed
 */
function segment(value: string, what: string): string {
  if (!isTopicSegment(value))
    throw new RangeError(`${what} "${value}" is not a valid topic segment`);
  return value;
}

export function rulesTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/rules/${segment(deviceId, 'device id')}`;
}

export function ruleEventsTopic(reservoirId: string, deviceId: string): string {
  return `${TOPIC_ROOT}/${segment(reservoirId, 'reservoir id')}/rule-events/${segment(deviceId, 'device id')}`;
}

export const RULE_EVENTS_SUBSCRIPTION = `${TOPIC_ROOT}/+/rule-events/+`;

/** Reads the reservoir and device out of a rules or rule-events topic; null for anything else. */
export function parseRuleTopic(
  topic: string,
): { kind: 'rules' | 'rule-events'; reservoirId: string; deviceId: string } | null {
  const p = topic.split('/');
  if (p.length !== 5 || p[0] !== 'stillwell' || p[1] !== 'v1') return null;
  const [, , reservoirId, kind, deviceId] = p as [string, string, string, string, string];
  if ((kind !== 'rules' && kind !== 'rule-events') || !isTopicSegment(reservoirId)) return null;
  if (!isTopicSegment(deviceId)) return null;
  return { kind, reservoirId, deviceId };
}

/** Below the trigger level by this much, a rule that fired arms itself again. */
export const RULE_REARM_BAND_M = 0.1;

export const ruleSettingSchema = z.strictObject({
  control: idSchema,
  enabled: z.boolean(),
  /** pool elevation, m, at which the control opens */
  riseAbove: z.number().min(-500).max(9000),
  /** opening it goes to, m for a gate, % for a valve */
  target: z.number().min(0).max(1000),
});
export type RuleSetting = z.infer<typeof ruleSettingSchema>;

export const ruleSetMessageSchema = z.strictObject({
  /**
   * increases with every change (the gateway uses its wall clock in ms, so that a gateway with a
   * fresh database still outranks the set a controller holds), and the answers name it
   */
  revision: z.number().int().min(0),
  rules: z.array(ruleSettingSchema).max(64),
});
export type RuleSetMessage = z.infer<typeof ruleSetMessageSchema>;

export const RULE_EVENT_KINDS = ['applied', 'rejected', 'triggered', 'rearmed'] as const;

export const ruleEventMessageSchema = z.strictObject({
  /** unique per event: a repeated delivery is recorded once */
  eventId: z.string().min(1).max(128),
  kind: z.enum(RULE_EVENT_KINDS),
  revision: z.number().int().min(0),
  control: idSchema.optional(),
  /** pool when it fired, m */
  pool: z.number().optional(),
  target: z.number().optional(),
  reason: z.string().max(1000).optional(),
  /** plant time at the controller, ISO */
  time: z.iso.datetime({ offset: true }),
});
export type RuleEventMessage = z.infer<typeof ruleEventMessageSchema>;

/** PUT .../automation/{control}: only a stepped-up duty engineer. */
export const updateRuleRequestSchema = z.strictObject({
  enabled: z.boolean(),
  riseAbove: z.number(),
  target: z.number().min(0),
});
export type UpdateRuleRequest = z.infer<typeof updateRuleRequestSchema>;

export const automaticRuleSchema = z.strictObject({
  reservoirId: z.string(),
  control: z.string(),
  enabled: z.boolean(),
  riseAbove: z.number(),
  target: z.number(),
  revision: z.number().int(),
  updatedBy: personSchema.nullable(),
  updatedAt: z.string().nullable(),
  /** what the controller said about the latest revision */
  device: z.strictObject({
    /** not-configured: no rule was ever set for this control (it never opens by itself) */
    state: z.enum(['not-configured', 'pending', 'applied', 'rejected']),
    detail: z.string().nullable(),
  }),
  lastTriggeredAt: z.string().nullable(),
});
export type AutomaticRule = z.infer<typeof automaticRuleSchema>;

export const automationEventSchema = z.strictObject({
  eventId: z.string(),
  reservoirId: z.string(),
  control: z.string().nullable(),
  kind: z.enum(RULE_EVENT_KINDS),
  pool: z.number().nullable(),
  target: z.number().nullable(),
  detail: z.string().nullable(),
  time: z.string(),
});
export type AutomationEvent = z.infer<typeof automationEventSchema>;

export const automationViewSchema = z.strictObject({
  rules: z.array(automaticRuleSchema),
  events: z.array(automationEventSchema),
});
export type AutomationView = z.infer<typeof automationViewSchema>;

/** What a gate controller sends back on its ack topic (see simulator/src/devices/commands.ts). */
export const commandAckMessageSchema = z.strictObject({
  commandId: z.string().min(1).max(128),
  status: z.enum(['accepted', 'rejected']),
  reason: z.string().max(2000).optional(),
  time: z.iso.datetime({ offset: true }),
});
export type CommandAckMessage = z.infer<typeof commandAckMessageSchema>;
