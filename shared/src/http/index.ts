import { z } from 'zod';

/** The gateway's error body (NestJS's shape); validation errors send `message` as a list. */
export const apiErrorSchema = z.object({
  statusCode: z.number(),
  message: z.union([z.string(), z.array(z.string())]),
  error: z.string().optional(),
  /** a machine-readable reason where the console must act on it (e.g. 'step-up-required') */
  code: z.string().optional(),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;
