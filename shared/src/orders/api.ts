import { z } from 'zod';
import { idSchema } from '../telemetry/message.js';
import { interlockCodeSchema, interlockReportSchema } from './interlocks.js';
import { faultCodeSchema, orderStateSchema } from './states.js';

/** Request and response shapes of the orders routes, shared by the gateway and the console. */

const isoTime = z.iso.datetime({ offset: true });
const comment = z.string().trim().min(3, 'at least 3 characters').max(2000);

/** Who did something, as the record keeps it. */
export const personSchema = z.strictObject({ userId: z.string(), username: z.string() });
export type Person = z.infer<typeof personSchema>;

export const controlTargetSchema = z.strictObject({
  /** a gate id, or the low-level outlet's id for its valve */
  control: idSchema,
  /** m for a gate, % for a valve */
  target: z.number().min(0, 'an opening cannot be negative').max(1000),
});
export type ControlTarget = z.infer<typeof controlTargetSchema>;

/** One move of a schedule: these targets, this many site minutes after execution. */
export const orderStepSchema = z
  .strictObject({
    offsetMin: z
      .number()
      .int()
      .min(0)
      .max(24 * 60),
    targets: z.array(controlTargetSchema).min(1, 'name at least one gate or valve').max(16),
  })
  .superRefine((step, ctx) => {
    const seen = new Set<string>();
    step.targets.forEach((t, i) => {
      if (seen.has(t.control))
        ctx.addIssue({
          code: 'custom',
          path: ['targets', i, 'control'],
          message: `"${t.control}" is named twice in one step`,
        });
      seen.add(t.control);
    });
  });
export type OrderStep = z.infer<typeof orderStepSchema>;

export const orderStepsSchema = z
  .array(orderStepSchema)
  .min(1, 'at least one step')
  .max(12)
  .superRefine((steps, ctx) => {
    if (steps[0] && steps[0].offsetMin !== 0)
      ctx.addIssue({
        code: 'custom',
        path: [0, 'offsetMin'],
        message: 'the first step starts at execution (0 min)',
      });
    for (let i = 1; i < steps.length; i++) {
      if (steps[i]!.offsetMin <= steps[i - 1]!.offsetMin)
        ctx.addIssue({
          code: 'custom',
          path: [i, 'offsetMin'],
          message: 'each step must come after the one before',
        });
    }
  });

export const createOrderRequestSchema = z.strictObject({
  steps: orderStepsSchema,
  /** when the operator means to execute it (site time); informative, default now */
  plannedStart: isoTime.optional(),
  reason: z.string().trim().min(5, 'at least 5 characters').max(2000),
});
export type CreateOrderRequest = z.infer<typeof createOrderRequestSchema>;

export const decisionRequestSchema = z.strictObject({ comment });
export type DecisionRequest = z.infer<typeof decisionRequestSchema>;
export const withdrawRequestSchema = z.strictObject({ comment });
export const countersignRequestSchema = z.strictObject({ comment });

/** The forecast run a draft rests on, attached by the gateway when the order is drafted. */
export const forecastLinkSchema = z.strictObject({
  runId: z.string(),
  issuedAt: isoTime,
  summary: z.string(),
});
export type ForecastLink = z.infer<typeof forecastLinkSchema>;

const peakSchema = z.strictObject({
  elevation: z.number(),
  /** s after the start of the routing */
  afterS: z.number(),
});

/** The draft's routed effect, computed with the shared hydraulics (see impact.ts). */
export const orderImpactSchema = z.strictObject({
  /** what the routing used for the inflow, in words */
  basis: z.string(),
  pool: z.number(),
  inflow: z.number().nullable(),
  currentRelease: z.number(),
  expectedRelease: z.number(),
  releaseChange: z.number(),
  /** steepest change of release while the gates travel, m3/s per minute */
  steepestRatePerMin: z.number(),
  horizonH: z.number(),
  peakWithout: peakSchema.nullable(),
  peakWith: peakSchema.nullable(),
  notes: z.array(z.string()),
});
export type OrderImpact = z.infer<typeof orderImpactSchema>;

export const COMMAND_STATES = [
  'queued',
  'sent',
  'accepted',
  'rejected',
  'ack-missing',
  'in-position',
  'not-following',
] as const;
export const commandStateSchema = z.enum(COMMAND_STATES);

export const orderCommandSchema = z.strictObject({
  commandId: z.string(),
  step: z.number().int(),
  deviceId: z.string(),
  targets: z.record(z.string(), z.number()),
  /** reported positions when the step was sent */
  from: z.record(z.string(), z.number()),
  state: commandStateSchema,
  sentAt: isoTime.nullable(),
  ackAt: isoTime.nullable(),
  reason: z.string().nullable(),
  confirmedAt: isoTime.nullable(),
});
export type OrderCommand = z.infer<typeof orderCommandSchema>;

const signed = z.strictObject({ by: personSchema, at: isoTime, comment: z.string() });

/** An order as the gateway serves it. Times are site time (plant time in the demo). */
export const orderSchema = z.strictObject({
  id: z.number().int().positive(),
  reservoirId: z.string(),
  state: orderStateSchema,
  /** executed without prior authorisation under a declared emergency */
  emergency: z.boolean(),
  emergencyId: z.number().int().nullable(),
  steps: z.array(orderStepSchema),
  reason: z.string(),
  plannedStart: isoTime,
  author: personSchema,
  createdAt: isoTime,
  forecast: forecastLinkSchema.nullable(),
  impact: orderImpactSchema.nullable(),
  decision: signed.extend({ outcome: z.enum(['authorised', 'declined']) }).nullable(),
  authorisedUntil: isoTime.nullable(),
  execution: z
    .strictObject({
      by: personSchema,
      at: isoTime,
      /** checks that failed but were waived under the emergency */
      waived: z.array(interlockCodeSchema),
      clearance: z.string(),
    })
    .nullable(),
  /** the step being carried out or last carried out */
  currentStep: z.number().int().nullable(),
  nextStepDue: isoTime.nullable(),
  commands: z.array(orderCommandSchema),
  fault: z.strictObject({ code: faultCodeSchema, detail: z.string(), at: isoTime }).nullable(),
  awaitingCountersign: z.boolean(),
  countersign: signed.nullable(),
  withdrawal: signed.nullable(),
  updatedAt: isoTime,
});
export type Order = z.infer<typeof orderSchema>;

export const orderListSchema = z.array(orderSchema);

export const EMERGENCY_LEVELS = [1, 2, 3] as const;
export const declareEmergencyRequestSchema = z.strictObject({
  /** the level of the emergency action plan */
  level: z.union([z.literal(1), z.literal(2), z.literal(3)]),
  reason: z.string().trim().min(5, 'at least 5 characters').max(2000),
});
export type DeclareEmergencyRequest = z.infer<typeof declareEmergencyRequestSchema>;
export const endEmergencyRequestSchema = z.strictObject({
  reason: z.string().trim().min(5, 'at least 5 characters').max(2000),
});

export const emergencySchema = z.strictObject({
  id: z.number().int(),
  reservoirId: z.string(),
  level: z.number().int(),
  reason: z.string(),
  declaredBy: personSchema,
  declaredAt: isoTime,
  ended: signed.nullable(),
});
export type Emergency = z.infer<typeof emergencySchema>;
/** GET .../emergency: the one in force, or null */
export const currentEmergencySchema = z.strictObject({ emergency: emergencySchema.nullable() });
export type CurrentEmergency = z.infer<typeof currentEmergencySchema>;

/** Refusals with a machine-readable reason the console can act on. */
export const ORDER_ERROR_CODES = [
  'invalid-order',
  'order-not-found',
  'wrong-state',
  'own-order',
  'not-authorised',
  'authorisation-lapsed',
  'interlock',
  'countersign-not-needed',
  'countersign-self',
  'engineer-required',
  'emergency-active',
  'no-emergency',
  'rule-invalid',
] as const;
export const orderErrorCodeSchema = z.enum(ORDER_ERROR_CODES);
export type OrderErrorCode = z.infer<typeof orderErrorCodeSchema>;

export const orderErrorSchema = z.object({
  statusCode: z.number().int(),
  code: orderErrorCodeSchema,
  message: z.string(),
  interlocks: interlockReportSchema.optional(),
});
export type OrderErrorBody = z.infer<typeof orderErrorSchema>;

/**
 * socket.io events on the live namespace. A room of their own (joining checks orders.read, which
 * fewer roles hold than telemetry.read); pushed after each commit.
 */
export const ORDER_LIVE_EVENTS = {
  /** client -> server: { reservoirId }, answered by an ack { ok, error? } */
  subscribe: 'orders-subscribe',
  unsubscribe: 'orders-unsubscribe',
  /** server -> client: Order, whenever one changes */
  order: 'order',
  /** server -> client: Emergency | null for the reservoir */
  emergency: 'emergency',
  /** server -> client: AutomaticRule, when a rule or its state changes */
  automation: 'automation',
  /** server -> client: OrderAlarm (ack missing, not following, refused) */
  alarm: 'order-alarm',
} as const;

export const orderAlarmSchema = z.strictObject({
  kind: z.enum(['order.ack-missing', 'order.not-following', 'order.command-rejected']),
  reservoirId: z.string(),
  orderId: z.number().int(),
  detail: z.string(),
  at: isoTime,
});
export type OrderAlarm = z.infer<typeof orderAlarmSchema>;
