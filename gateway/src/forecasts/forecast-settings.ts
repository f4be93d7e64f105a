import type { ConfigService } from '@nestjs/config';
import { z } from 'zod';

/**
 * The forecast's environment variables (see docs/forecasts.md), checked when the module starts so
 * that a bad value stops the gateway naming the variable. Read here rather than in config/ so the
 * forecast module owns its settings.
 */
const settingsSchema = z.object({
  /** wall ms between checks of the site clock; 0 turns the scheduled recompute off (tests) */
  FORECAST_TICK_MS: z.coerce.number().int().min(0).max(60_000).default(100),
  /** a scheduled run once per this much SITE time */
  FORECAST_EVERY_SITE_S: z.coerce.number().min(1).max(3600).default(60),
  /** wall ms a material telemetry change waits for more changes before it runs */
  FORECAST_DEBOUNCE_MS: z.coerce.number().int().min(0).max(600_000).default(1000),
  FORECAST_HORIZON_H: z.coerce.number().min(1).max(168).default(24),
  /** routing step of the deterministic run and the decision searches, s */
  FORECAST_DT_S: z.coerce.number().int().min(10).max(900).default(60),
  /** spacing of the stored and pushed series, s */
  FORECAST_OUTPUT_STEP_S: z.coerce.number().int().min(60).max(3600).default(300),
  FORECAST_MEMBERS: z.coerce.number().int().min(1).max(5000).default(200),
  /** routing step of the ensemble members, s (coarser: 200 members at 60 s cost 4x as much) */
  FORECAST_ENSEMBLE_DT_S: z.coerce.number().int().min(10).max(900).default(300),
  /** the standard plan opens every spillway gate to this fraction of its largest opening */
  FORECAST_PLAN_OPENING: z.coerce.number().min(0.05).max(1).default(1),
  /** how far back the "too late" check replays the observed inflow, h */
  FORECAST_LOOKBACK_H: z.coerce.number().min(0).max(48).default(6),
});
export type ForecastEnv = z.infer<typeof settingsSchema>;

export interface ForecastSettings {
  tickMs: number;
  everySiteMs: number;
  debounceMs: number;
  /** what the computation depends on; hashed into each run's code version */
  options: ForecastOptions;
}

/** The options of the computation itself (everything a run's outputs depend on besides inputs). */
export interface ForecastOptions {
  horizonS: number;
  dtS: number;
  outputStepS: number;
  ensemble: {
    members: number;
    dtS: number;
    sigma: number;
    growthS: number;
    correlationS: number;
    intervalS: number;
  };
  inflow: {
    /** least-squares window of the trend and of the rising/falling decision, s */
    trendWindowS: number;
    /** the trend is continued this long, then held, s */
    trendHoldS: number;
    /** window of the recession fit, s (also how much history is read) */
    recessionWindowS: number;
    /** |slope| above this fraction of the current flow per hour counts as rising or falling */
    slopeFractionPerHour: number;
    /** ... and above this many m3/s per hour */
    slopeMinPerHour: number;
  };
  planOpeningFraction: number;
  lookbackS: number;
}

export function readForecastSettings(config: ConfigService): ForecastSettings {
  const raw = Object.fromEntries(
    Object.keys(settingsSchema.shape).map((k) => [k, config.get<string>(k)]),
  );
  const parsed = settingsSchema.safeParse(raw);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration: ${problems.join('; ')}`);
  }
  return settingsFromEnv(parsed.data);
}

export function settingsFromEnv(env: ForecastEnv): ForecastSettings {
  const horizonS = env.FORECAST_HORIZON_H * 3600;
  // The grids must fit the horizon exactly: round it up to a whole number of every step.
  const lcm = [env.FORECAST_DT_S, env.FORECAST_ENSEMBLE_DT_S, env.FORECAST_OUTPUT_STEP_S].reduce(
    (a, b) => (a * b) / gcd(a, b),
  );
  return {
    tickMs: env.FORECAST_TICK_MS,
    everySiteMs: env.FORECAST_EVERY_SITE_S * 1000,
    debounceMs: env.FORECAST_DEBOUNCE_MS,
    options: {
      horizonS: Math.ceil(horizonS / lcm) * lcm,
      dtS: env.FORECAST_DT_S,
      outputStepS: env.FORECAST_OUTPUT_STEP_S,
      ensemble: {
        members: env.FORECAST_MEMBERS,
        dtS: env.FORECAST_ENSEMBLE_DT_S,
        // the hydraulics engine's judgement defaults, stated so that the hash covers them
        sigma: 0.3,
        growthS: 12 * 3600,
        correlationS: 6 * 3600,
        intervalS: 900,
      },
      inflow: {
        trendWindowS: 3 * 3600,
        trendHoldS: 3 * 3600,
        recessionWindowS: 12 * 3600,
        slopeFractionPerHour: 0.02,
        slopeMinPerHour: 1,
      },
      planOpeningFraction: env.FORECAST_PLAN_OPENING,
      lookbackS: env.FORECAST_LOOKBACK_H * 3600,
    },
  };
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** The defaults, for tests and benchmarks. */
export const DEFAULT_FORECAST_SETTINGS = settingsFromEnv(settingsSchema.parse({}));
