import { z } from 'zod';
import { templateProblems } from './template.js';

/** A notice (one order, one zone): prepared for review, sent, or withdrawn when the order is dropped. */
export const NOTICE_STATES = ['prepared', 'sent', 'withdrawn'] as const;
export type NoticeState = (typeof NOTICE_STATES)[number];

/** One message to one contact, as the mail server saw it. */
export const DELIVERY_STATES = ['not-sent', 'delivered', 'bounced'] as const;
export type DeliveryState = (typeof DELIVERY_STATES)[number];

/**
 * Where a recipient stands, in the liaison's words: not yet told, told (and within their window),
 * acknowledged, silent (window passed without a word), or bounced (the mail server refused it).
 */
export const STANDINGS = ['waiting', 'told', 'acknowledged', 'silent', 'bounced'] as const;
export type Standing = (typeof STANDINGS)[number];

export const recipientSchema = z.strictObject({
  id: z.string(),
  contactId: z.string(),
  organisation: z.string(),
  person: z.string(),
  role: z.string(),
  email: z.string(),
  phone: z.string(),
  /** place in the zone's chain when the message was addressed */
  chainLevel: z.number().int(),
  /** first-call: must be told before the release (the interlock waits for them); escalation: told because someone before them was silent */
  reason: z.enum(['first-call', 'escalation']),
  delivery: z.enum(DELIVERY_STATES),
  standing: z.enum(STANDINGS),
  /** site epoch ms */
  sentAt: z.number().nullable(),
  deliveredAt: z.number().nullable(),
  bouncedAt: z.number().nullable(),
  bounceReason: z.string().nullable(),
  acknowledgedAt: z.number().nullable(),
  acknowledgedVia: z.enum(['link', 'console']).nullable(),
  /** acknowledgement due by, site epoch ms (delivery + window) */
  ackDueAt: z.number().nullable(),
  escalatedAt: z.number().nullable(),
  leadTimeS: z.number(),
  /** when their lead time has run, site epoch ms (sending + lead time, once the mail server accepted it) */
  leadTimeRunsAt: z.number().nullable(),
});
export type Recipient = z.infer<typeof recipientSchema>;

export const noticeSchema = z.strictObject({
  id: z.string(),
  reservoirId: z.string(),
  orderId: z.string(),
  zoneId: z.string(),
  zoneName: z.string(),
  distanceM: z.number(),
  affectedAtM3s: z.number(),
  state: z.enum(NOTICE_STATES),
  emergency: z.boolean(),
  releaseM3s: z.number(),
  previousReleaseM3s: z.number().nullable(),
  /** when the release starts at the dam, site epoch ms (recomputed when sent, to honour lead times) */
  startAt: z.number(),
  arrivalAt: z.number(),
  durationS: z.number().nullable(),
  travelTimeS: z.number(),
  beyondTable: z.enum(['below', 'above']).nullable(),
  subject: z.string(),
  template: z.string(),
  /** the message as the first recipient would receive it, without the link */
  preview: z.string(),
  preparedAt: z.number(),
  sentAt: z.number().nullable(),
  sentBy: z.string().nullable(),
  recipients: z.array(recipientSchema),
});
export type Notice = z.infer<typeof noticeSchema>;
export const noticeListSchema = z.array(noticeSchema);

const templateText = (max: number) =>
  z
    .string()
    .min(1, 'required')
    .max(max)
    .superRefine((t, ctx) => {
      for (const message of templateProblems(t)) ctx.addIssue({ code: 'custom', message });
    });

/** PUT /api/notices/:id/wording: the liaison's wording of a prepared notice, subject and text. */
export const noticeEditSchema = z.strictObject({
  subject: templateText(200),
  template: templateText(4000),
});
export type NoticeEdit = z.infer<typeof noticeEditSchema>;

/** POST /api/reservoirs/:id/notices/prepare: notices for a planned release (the orders module calls the same). */
export const prepareRequestSchema = z.strictObject({
  orderId: z.string().min(1).max(64),
  targetReleaseM3s: z.number().positive().max(100_000),
  currentReleaseM3s: z.number().min(0).max(100_000).nullable(),
  plannedStartAt: z.number().nullable(),
  durationS: z.number().positive().nullable(),
});
export type PrepareRequest = z.infer<typeof prepareRequestSchema>;

/** POST /api/reservoirs/:id/contacts/import body: the file's text. */
export const importRequestSchema = z.strictObject({
  csv: z.string().min(1, 'the file is empty').max(500_000),
});
export type ImportRequest = z.infer<typeof importRequestSchema>;

/** POST /api/reservoirs/:id/contacts/import answer: all imported, or nothing and every problem. */
export const importResultSchema = z.strictObject({
  imported: z.number().int(),
  problems: z.array(
    z.strictObject({ row: z.number(), column: z.string().optional(), message: z.string() }),
  ),
});
export type ImportResult = z.infer<typeof importResultSchema>;

/** A stakeholder's view: releases that concern their zones, and whether they have acknowledged. */
export const myReleaseSchema = z.strictObject({
  /** null when the notice went to others in their zone and not (yet) to them: they see it, cannot acknowledge it */
  recipientId: z.string().nullable(),
  noticeId: z.string(),
  reservoirId: z.string(),
  damName: z.string(),
  /** the site's zone, for showing the times */
  timeZone: z.string(),
  zoneName: z.string(),
  organisation: z.string(),
  releaseM3s: z.number(),
  startAt: z.number(),
  arrivalAt: z.number(),
  durationS: z.number().nullable(),
  /** upcoming: the rise has not reached the zone yet; active: it has, and has not ended */
  phase: z.enum(['upcoming', 'active']),
  message: z.string(),
  acknowledgedAt: z.number().nullable(),
  emergency: z.boolean(),
});
export type MyRelease = z.infer<typeof myReleaseSchema>;
export const myReleaseListSchema = z.array(myReleaseSchema);

/** One message the demo mail server received (demo mode only). */
export const outboxMessageSchema = z.strictObject({
  id: z.number().int(),
  receivedAt: z.number(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
export const outboxListSchema = z.array(outboxMessageSchema);
