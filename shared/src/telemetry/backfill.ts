import { z } from 'zod';

const seqSchema = z.number().int().min(0).max(Number.MAX_SAFE_INTEGER);

/**
 * Gateway -> device, on stillwell/v1/{reservoirId}/backfill/{deviceId} (QoS 1): "send again the
 * readings fromSeq..toSeq (inclusive) that I never got". The device republishes those it still
 * holds on its telemetry topic with their original seq and time, then answers on backfill-reply.
 */
export const backfillRequestSchema = z
  .strictObject({
    /** echoed in the reply, so the gateway can match it to the gap it asked about */
    requestId: z.string().min(1).max(64),
    fromSeq: seqSchema,
    toSeq: seqSchema,
  })
  .refine((r) => r.toSeq >= r.fromSeq, {
    message: 'toSeq must not be below fromSeq',
    path: ['toSeq'],
  });
export type BackfillRequest = z.infer<typeof backfillRequestSchema>;

/**
 * Why a device cannot send a reading again:
 * - overrun: older than anything it still holds (its bounded buffer let it go)
 * - not-held: inside its buffer's span but never stored (lost in the device itself, e.g. a drop-out)
 * - not-produced: beyond the last sequence number it has produced
 */
export const BACKFILL_UNAVAILABLE_REASONS = ['overrun', 'not-held', 'not-produced'] as const;
export type BackfillUnavailableReason = (typeof BACKFILL_UNAVAILABLE_REASONS)[number];

/** Device -> gateway, on stillwell/v1/{reservoirId}/backfill-reply/{deviceId} (QoS 1). */
export const backfillReplySchema = z.strictObject({
  requestId: z.string().min(1).max(64),
  fromSeq: seqSchema,
  toSeq: seqSchema,
  /** how many readings of the range the device republished */
  resent: z.number().int().min(0),
  /** the parts of the range it cannot send, at most 100 runs */
  unavailable: z
    .array(
      z.strictObject({
        fromSeq: seqSchema,
        toSeq: seqSchema,
        reason: z.enum(BACKFILL_UNAVAILABLE_REASONS),
      }),
    )
    .max(100),
});
export type BackfillReply = z.infer<typeof backfillReplySchema>;
