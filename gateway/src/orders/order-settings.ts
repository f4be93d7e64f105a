import type { ConfigService } from '@nestjs/config';
import { z } from 'zod';

/**
 * The orders module's environment variables (README, docs/operations.md), checked when the module
 * starts so that a bad value stops the gateway naming the variable.
 *
 * Which clock each one runs on:
 * - An authorisation's lifetime is SITE time. It exists because the pool and the forecast the
 *   engineer reviewed move on; they move at plant speed (360x in the demo, where 30 wall minutes
 *   would outlast the whole storm). In production site time is the wall clock anyway.
 * - The acknowledgement timeout is WALL time: it measures the network and the controller, which
 *   answer in milliseconds whatever the plant's speed.
 * - Following and arrival deadlines are SITE time: gates travel at their real speed in plant time.
 */
const schema = z.object({
  ORDER_AUTHORISATION_TTL_MIN: z.coerce
    .number()
    .min(1)
    .max(24 * 60)
    .default(30),
  ORDER_ACK_TIMEOUT_MS: z.coerce.number().int().min(50).max(600_000).default(10_000),
  /** site seconds after the acknowledgement within which the position must start to move */
  ORDER_FOLLOW_GRACE_S: z.coerce.number().min(10).max(3600).default(120),
  /** the steepest allowed change of release while gates travel, m3/s per minute */
  ORDER_RELEASE_RATE_MAX: z.coerce.number().positive().max(100_000).default(60),
  /** wall ms between sweeps (deadlines, due steps, lapsed authorisations); 0: off (tests) */
  ORDER_TICK_MS: z.coerce.number().int().min(0).max(60_000).default(1000),
});

export interface OrderSettings {
  authorisationTtlMs: number;
  ackTimeoutMs: number;
  followGraceMs: number;
  releaseRateMaxPerMin: number;
  tickMs: number;
}

export function readOrderSettings(config: ConfigService): OrderSettings {
  const raw = Object.fromEntries(
    Object.keys(schema.shape).map((k) => [k, config.get<string>(k) ?? undefined]),
  );
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`Invalid configuration: ${problems}`);
  }
  const e = parsed.data;
  return {
    authorisationTtlMs: e.ORDER_AUTHORISATION_TTL_MIN * 60_000,
    ackTimeoutMs: e.ORDER_ACK_TIMEOUT_MS,
    followGraceMs: e.ORDER_FOLLOW_GRACE_S * 1000,
    releaseRateMaxPerMin: e.ORDER_RELEASE_RATE_MAX,
    tickMs: e.ORDER_TICK_MS,
  };
}
