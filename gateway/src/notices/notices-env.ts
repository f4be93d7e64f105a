import { z } from 'zod';

/** Downstream notices (see README's configuration table and docs/operations.md). */
export const noticesEnv = {
  /** the console's address as a contact's browser reaches it, for acknowledgement links; default http://localhost:PORT */
  PUBLIC_URL: z.string().url().optional(),
  /** HMAC key of acknowledgement links (32+ characters); default: derived from JWT_SECRET, or random per start in demo mode */
  ACK_LINK_SECRET: z.string().min(32).optional(),
  /** an acknowledgement link works this long after it was sent, wall-clock hours */
  ACK_LINK_TTL_H: z.coerce
    .number()
    .min(0.01)
    .max(24 * 30)
    .default(72),
  /** how often escalation windows are checked, wall ms; 0 turns the timer off (tests drive it) */
  NOTICE_TICK_MS: z.coerce.number().int().min(0).max(60_000).default(1000),
};
