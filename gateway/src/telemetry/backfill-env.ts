import { z } from 'zod';

/** How the gateway asks devices for readings it missed (docs/reliability.md). */
export const backfillEnv = {
  /** the most sequence numbers one backfill request asks for; a longer gap is asked in parts */
  BACKFILL_MAX_SEQS: z.coerce.number().int().min(1).max(100_000).default(500),
  /** requests per part (and re-checks per gap) before the gap is given up as unanswered */
  BACKFILL_ATTEMPTS: z.coerce.number().int().min(1).max(100).default(5),
  /** how long to wait for an answer before asking again, wall ms */
  BACKFILL_RETRY_MS: z.coerce.number().int().min(10).max(600_000).default(5000),
};
