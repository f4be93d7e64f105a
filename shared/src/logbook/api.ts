import { z } from 'zod';

/** Logbook shapes served by the gateway and read by the console. */
export const logbookEntrySchema = z.strictObject({
  seq: z.number().int().positive(),
  time: z.string(),
  actorId: z.string().nullable(),
  actorName: z.string().nullable(),
  actorRoles: z.array(z.string()),
  kind: z.string(),
  payload: z.record(z.string(), z.unknown()),
  prevHash: z.string(),
  hash: z.string(),
});
export type LogbookEntry = z.infer<typeof logbookEntrySchema>;

export const logbookHeadSchema = z.strictObject({
  seq: z.number().int().nullable(),
  hash: z.string().nullable(),
  time: z.string().nullable(),
});
export type LogbookHead = z.infer<typeof logbookHeadSchema>;

export const verificationReportSchema = z.strictObject({
  ok: z.boolean(),
  count: z.number().int(),
  headSeq: z.number().int().nullable(),
  headHash: z.string().nullable(),
  checkedAt: z.string(),
  firstBad: z
    .strictObject({
      seq: z.number().int(),
      problem: z.enum(['hash-mismatch', 'broken-link', 'missing-entries', 'head-mismatch']),
      detail: z.string(),
    })
    .optional(),
});
export type VerificationReport = z.infer<typeof verificationReportSchema>;
