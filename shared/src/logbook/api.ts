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
  /** the attachments the entries name, checked against their SHA-256 on disk */
  attachments: z
    .strictObject({
      checked: z.number().int(),
      bad: z.array(
        z.strictObject({
          seq: z.number().int(),
          sha256: z.string(),
          problem: z.enum(['missing', 'altered']),
          detail: z.string(),
        }),
      ),
    })
    .optional(),
});
export type VerificationReport = z.infer<typeof verificationReportSchema>;

export const logbookPageSchema = z.strictObject({
  rows: z.array(logbookEntrySchema),
  total: z.number().int(),
});
export type LogbookPage = z.infer<typeof logbookPageSchema>;
