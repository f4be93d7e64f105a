import { z } from 'zod';

/** Retention of raw readings and the minute aggregates (docs/replay.md). */
export const retentionEnv = {
  /** raw readings older than this (site time) are deleted once their minutes are aggregated, days */
  READINGS_RETENTION_DAYS: z.coerce.number().positive().max(36_500).default(30),
  /** a minute counts as closed this long after its end (site time), for readings that come late, s */
  AGGREGATE_GRACE_S: z.coerce.number().int().min(0).max(86_400).default(120),
  /** how often the aggregate and prune jobs run, wall ms; 0 turns the timer off (tests drive them) */
  RETENTION_TICK_MS: z.coerce.number().int().min(0).max(3_600_000).default(10_000),
};
