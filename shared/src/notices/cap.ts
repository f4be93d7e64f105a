import { z } from 'zod';

/**
 * The OASIS Common Alerting Protocol, version 1.2 (OASIS Standard, 1 July 2010): the value lists
 * this product uses, spelled exactly as the standard's section 3.2 gives them, and the shape of
 * the alerts it publishes. Serialising to XML happens in the gateway.
 */
export const CAP_NAMESPACE = 'urn:oasis:names:tc:emergency:cap:1.2';

/** CAP 1.2 3.2.1 <status> */
export const CAP_STATUS = ['Actual', 'Exercise', 'System', 'Test', 'Draft'] as const;
/** CAP 1.2 3.2.1 <msgType> */
export const CAP_MSG_TYPE = ['Alert', 'Update', 'Cancel', 'Ack', 'Error'] as const;
/** CAP 1.2 3.2.1 <scope> */
export const CAP_SCOPE = ['Public', 'Restricted', 'Private'] as const;
/** CAP 1.2 3.2.2 <category> */
export const CAP_CATEGORY = [
  'Geo',
  'Met',
  'Safety',
  'Security',
  'Rescue',
  'Fire',
  'Health',
  'Env',
  'Transport',
  'Infra',
  'CBRNE',
  'Other',
] as const;
/** CAP 1.2 3.2.2 <responseType> */
export const CAP_RESPONSE_TYPE = [
  'Shelter',
  'Evacuate',
  'Prepare',
  'Execute',
  'Avoid',
  'Monitor',
  'Assess',
  'AllClear',
  'None',
] as const;
/** CAP 1.2 3.2.2 <urgency> */
export const CAP_URGENCY = ['Immediate', 'Expected', 'Future', 'Past', 'Unknown'] as const;
/** CAP 1.2 3.2.2 <severity> */
export const CAP_SEVERITY = ['Extreme', 'Severe', 'Moderate', 'Minor', 'Unknown'] as const;
/** CAP 1.2 3.2.2 <certainty> */
export const CAP_CERTAINTY = ['Observed', 'Likely', 'Possible', 'Unlikely', 'Unknown'] as const;

/**
 * CAP 1.2 3.3.2 DateTime: "2002-05-24T16:49:00-07:00". Seconds, no fraction, and a numeric offset:
 * the standard forbids "Z" and spells UTC "-00:00".
 */
export const CAP_DATETIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[+-]\d{2}:\d{2}$/;
export function capDateTime(epochMs: number): string {
  return `${new Date(Math.floor(epochMs / 1000) * 1000).toISOString().slice(0, 19)}-00:00`;
}

/** CAP 1.2 3.2.1: identifier and sender must not hold spaces, commas or restricted characters (< and &). */
const CAP_TOKEN = /^[^\s,<&]+$/;
const capTime = z
  .string()
  .regex(CAP_DATETIME, 'a CAP 1.2 date-time (no "Z", offset -00:00 for UTC)');

export const capAreaSchema = z.strictObject({
  areaDesc: z.string().min(1),
});

export const capInfoSchema = z.strictObject({
  language: z.string().min(2),
  category: z.array(z.enum(CAP_CATEGORY)).min(1),
  event: z.string().min(1),
  responseType: z.array(z.enum(CAP_RESPONSE_TYPE)),
  urgency: z.enum(CAP_URGENCY),
  severity: z.enum(CAP_SEVERITY),
  certainty: z.enum(CAP_CERTAINTY),
  onset: capTime.optional(),
  expires: capTime.optional(),
  senderName: z.string().optional(),
  headline: z.string().optional(),
  description: z.string().optional(),
  instruction: z.string().optional(),
  parameter: z.array(z.strictObject({ valueName: z.string().min(1), value: z.string() })),
  area: z.array(capAreaSchema).min(1),
});
export type CapInfo = z.infer<typeof capInfoSchema>;

/** One CAP 1.2 <alert>, with the elements the standard requires and the optional ones we fill. */
export const capAlertSchema = z.strictObject({
  identifier: z.string().regex(CAP_TOKEN, 'no spaces, commas, < or &'),
  sender: z.string().regex(CAP_TOKEN, 'no spaces, commas, < or &'),
  sent: capTime,
  status: z.enum(CAP_STATUS),
  msgType: z.enum(CAP_MSG_TYPE),
  scope: z.enum(CAP_SCOPE),
  note: z.string().optional(),
  info: z.array(capInfoSchema).min(1),
});
export type CapAlert = z.infer<typeof capAlertSchema>;

/** GET /api/notices/feed.json: the same alerts as the CAP XML feed. */
export const capFeedSchema = z.strictObject({
  generatedAt: capTime,
  alerts: z.array(capAlertSchema),
});
export type CapFeed = z.infer<typeof capFeedSchema>;

/** CAP urgency from how soon the rise reaches the zone: within the hour is Expected (3.2.2). */
export function capUrgency(arrivalAt: number, now: number): (typeof CAP_URGENCY)[number] {
  const leftS = (arrivalAt - now) / 1000;
  if (leftS <= 0) return 'Immediate';
  if (leftS <= 3600) return 'Expected';
  return 'Future';
}

/** CAP severity from how far the release passes the zone's threshold. */
export function capSeverity(
  releaseM3s: number,
  affectedAtM3s: number,
): (typeof CAP_SEVERITY)[number] {
  const ratio = releaseM3s / affectedAtM3s;
  if (ratio >= 3) return 'Extreme';
  if (ratio >= 1.5) return 'Severe';
  return 'Moderate';
}
