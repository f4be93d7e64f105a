import { z } from 'zod';

/** Phone numbers as people write them: digits, spaces, dashes, brackets, an optional leading +. */
export const PHONE_PATTERN = /^\+?[0-9][0-9 ()./-]{3,28}[0-9]$/;

const contactFields = {
  zoneId: z.string().min(1, 'required'),
  organisation: z.string().trim().min(1, 'required').max(120),
  person: z.string().trim().min(1, 'required').max(120),
  /** their role in their organisation, in their words ("duty officer", "site manager") */
  role: z.string().trim().min(1, 'required').max(80),
  email: z.string().trim().pipe(z.email('not an e-mail address')),
  phone: z.string().trim().regex(PHONE_PATTERN, 'not a phone number'),
  /** how long before a release they must have been told, s */
  leadTimeS: z
    .number()
    .int()
    .min(0, 'must not be negative')
    .max(7 * 86_400, 'at most 7 days'),
  /** place in the zone's chain: 1 is told first, the next place when a place stays silent */
  escalationOrder: z.number().int().min(1, '1 or more').max(20, 'at most 20'),
  /** how long they have to acknowledge before the next in the chain is told, s */
  ackWindowS: z.number().int().min(60, 'at least 1 minute').max(86_400, 'at most 24 hours'),
  /** the stakeholder account they sign in to the console with, if any */
  userId: z.string().min(1).max(64).nullable(),
  active: z.boolean(),
};

/** POST and PUT /api/reservoirs/:id/contacts body. */
export const contactInputSchema = z.strictObject(contactFields);
export type ContactInput = z.infer<typeof contactInputSchema>;

export const contactSchema = z.strictObject({
  ...contactFields,
  id: z.string().min(1),
  zoneName: z.string(),
  /** the linked account's username, when there is one */
  username: z.string().nullable(),
  updatedAt: z.number(),
});
export type Contact = z.infer<typeof contactSchema>;
export const contactListSchema = z.array(contactSchema);

/** Defaults a new contact starts from in the console's form. */
export const CONTACT_DEFAULTS = {
  leadTimeS: 3600,
  escalationOrder: 1,
  ackWindowS: 1800,
  active: true,
} as const;
