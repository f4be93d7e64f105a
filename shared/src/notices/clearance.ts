import { z } from 'zod';

/**
 * The downstream side of the gate-order interlock. An order may not be executed until every
 * contact who must be told before its release has been told (the mail server accepted the notice)
 * and their lead time has run on the site clock; under a declared emergency it may, and the
 * shortfall is recorded instead. The gateway's notices module implements DownstreamClearance.
 */
export interface ReleaseOrderFacts {
  orderId: string;
  reservoirId: string;
  /** the release the order would set, m3/s */
  targetReleaseM3s: number;
  /** the release before the order, when known, m3/s */
  currentReleaseM3s: number | null;
  /** when the order means to start, site epoch ms; null: as soon as allowed */
  plannedStartAt: number | null;
  /** how long the raised release is meant to last, s; null: until a later order */
  durationS: number | null;
  /** executed under a declared emergency */
  emergency: boolean;
}

export const SHORTFALL_REASONS = [
  /** the zone has no active contact: nobody can be told */
  'no-contacts',
  /** no notice was prepared for the zone, or it was withdrawn */
  'not-prepared',
  /** prepared, not yet sent by the liaison */
  'not-sent',
  /** sent, but the mail server has not accepted it (or refused it) */
  'not-delivered',
  /** delivered; the contact's lead time is still running */
  'lead-time-running',
] as const;
export type ShortfallReason = (typeof SHORTFALL_REASONS)[number];

export const clearanceShortfallSchema = z.strictObject({
  zoneId: z.string(),
  zoneName: z.string(),
  contactId: z.string().nullable(),
  contactName: z.string().nullable(),
  reason: z.enum(SHORTFALL_REASONS),
  /** when this contact's lead time will have run, site epoch ms; null while that is not known */
  readyAt: z.number().nullable(),
});
export type ClearanceShortfall = z.infer<typeof clearanceShortfallSchema>;

export const clearanceVerdictSchema = z.strictObject({
  orderId: z.string(),
  /** nothing stands in the way downstream (or an emergency overrides it) */
  clear: z.boolean(),
  emergency: z.boolean(),
  /** site epoch ms of the check */
  checkedAt: z.number(),
  /** when every lead time will have run, if every notice is delivered; null otherwise */
  clearAt: z.number().nullable(),
  shortfalls: z.array(clearanceShortfallSchema),
  /** one sentence for the operator: why not, or that it is clear */
  summary: z.string(),
});
export type ClearanceVerdict = z.infer<typeof clearanceVerdictSchema>;

export interface DownstreamClearance {
  check(order: ReleaseOrderFacts): Promise<ClearanceVerdict>;
}

/** What the assessment needs to know about one affected zone. */
export interface ZoneClearanceInput {
  zoneId: string;
  zoneName: string;
  activeContacts: number;
  notice: null | {
    state: 'prepared' | 'sent' | 'withdrawn';
    /** the contacts that must be told before the release: the first place in the zone's chain */
    required: Array<{
      contactId: string;
      contactName: string;
      /** when the message was handed to the mail server: the lead time counts from here */
      sentAt: number | null;
      /** when the mail server accepted it: until then the contact is not told */
      deliveredAt: number | null;
      leadTimeS: number;
    }>;
  };
}

const REASON_TEXT: Record<ShortfallReason, string> = {
  'no-contacts': 'has no contact to tell',
  'not-prepared': 'has no notice prepared',
  'not-sent': 'has not been sent its notice',
  'not-delivered': 'has a notice the mail server has not accepted',
  'lead-time-running': 'is still within its lead time',
};

/** The verdict, pure: who is not yet told or still within their lead time at `now`. */
export function assessClearance(
  order: Pick<ReleaseOrderFacts, 'orderId' | 'emergency'>,
  zones: readonly ZoneClearanceInput[],
  now: number,
): ClearanceVerdict {
  const shortfalls: ClearanceShortfall[] = [];
  let clearAt: number | null = now;
  const short = (
    z: ZoneClearanceInput,
    reason: ShortfallReason,
    who?: { contactId: string; contactName: string },
    readyAt: number | null = null,
  ) =>
    shortfalls.push({
      zoneId: z.zoneId,
      zoneName: z.zoneName,
      contactId: who?.contactId ?? null,
      contactName: who?.contactName ?? null,
      reason,
      readyAt,
    });
  for (const zone of zones) {
    if (zone.activeContacts === 0) {
      short(zone, 'no-contacts');
      clearAt = null;
    } else if (!zone.notice || zone.notice.state === 'withdrawn') {
      short(zone, 'not-prepared');
      clearAt = null;
    } else if (zone.notice.state === 'prepared') {
      short(zone, 'not-sent');
      clearAt = null;
    } else {
      for (const r of zone.notice.required) {
        if (r.deliveredAt === null) {
          short(zone, 'not-delivered', r);
          clearAt = null;
          continue;
        }
        // counted from the sending, as the notice's start time was: the seconds the mail server takes
        // (minutes of plant time in the demo) must not make the real start later than the one stated
        const readyAt = (r.sentAt ?? r.deliveredAt) + r.leadTimeS * 1000;
        if (readyAt > now) short(zone, 'lead-time-running', r, readyAt);
        if (clearAt !== null) clearAt = Math.max(clearAt, readyAt);
      }
    }
  }
  const clear = shortfalls.length === 0 || order.emergency;
  return {
    orderId: order.orderId,
    clear,
    emergency: order.emergency,
    checkedAt: now,
    clearAt,
    shortfalls,
    summary: zones.length
      ? summarise(shortfalls, order.emergency, clearAt)
      : 'No downstream zone is affected by this release: no notice is needed.',
  };
}

function summarise(
  shortfalls: readonly ClearanceShortfall[],
  emergency: boolean,
  clearAt: number | null,
): string {
  if (!shortfalls.length)
    return 'Downstream is clear: every required contact has been told and has had their lead time.';
  const first = shortfalls[0]!;
  const who = first.contactName ? `${first.contactName} (${first.zoneName})` : first.zoneName;
  const more = shortfalls.length > 1 ? ` and ${shortfalls.length - 1} more` : '';
  const text = `${who} ${REASON_TEXT[first.reason]}${more}`;
  if (emergency)
    return `Declared emergency: downstream is not clear (${text}); the shortfall is recorded.`;
  const when = clearAt !== null ? ' Clear once the last lead time has run.' : '';
  return `Not clear downstream: ${text}.${when}`;
}
