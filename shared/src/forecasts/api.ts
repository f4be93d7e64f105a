import { z } from 'zod';
import { THRESHOLD_KINDS } from '../reservoirs/definition.js';

/**
 * Shapes of the live forecast as the gateway stores, serves and pushes it. Times are epoch ms of
 * site time unless named ...S (seconds). Elevations m, flows m3/s.
 */

/** Who decides, whatever the software says: one wording for every caution. */
export const PREVAILING_AUTHORITY =
  "the dam's approved operating rules, its emergency action plan, local codes and the responsible " +
  'licensed engineer';

/** Said wherever a forecast is shown or served. */
export const FORECAST_CAUTION =
  'Decision support only: a model forecast from measurements that can be wrong. ' +
  `${capitalise(PREVAILING_AUTHORITY)} prevail.`;

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

export const FORECAST_TRIGGERS = ['schedule', 'telemetry', 'definition', 'startup'] as const;
export type ForecastTrigger = (typeof FORECAST_TRIGGERS)[number];

export const INFLOW_METHODS = ['persistence', 'linear-trend', 'recession'] as const;

/** Columnar, on a regular grid from startMs every stepS (downsampled from the routing step). */
export const forecastSeriesSchema = z.strictObject({
  startMs: z.number(),
  stepS: z.number().positive(),
  /** base inflow forecast */
  inflow: z.array(z.number()),
  /** deterministic run: the base inflow with the gates held where they are */
  elevation: z.array(z.number()),
  outflow: z.array(z.number()),
  /** ensemble quantiles of pool elevation */
  p10: z.array(z.number()),
  p50: z.array(z.number()),
  p90: z.array(z.number()),
});
export type ForecastSeries = z.infer<typeof forecastSeriesSchema>;

export const forecastInputsSchema = z.strictObject({
  /** the site's now when the run started: the forecast starts here */
  siteNowMs: z.number(),
  startElevation: z.number(),
  /** the pool gauge the start elevation came from */
  poolSource: z.string(),
  /** gate openings (m) and valve openings (%) held over the horizon */
  openings: z.record(z.string(), z.number()),
  /** controls without a usable reading, taken as closed (errs towards a higher pool) */
  assumedClosed: z.array(z.string()),
  tailwater: z.number().nullable(),
  inflow: z.strictObject({
    method: z.enum(INFLOW_METHODS),
    /** why this method was chosen */
    reason: z.string(),
    nowFlow: z.number(),
    parameters: z.record(z.string(), z.number()),
    notes: z.array(z.string()),
    observedPoints: z.number().int(),
    observedFromMs: z.number().nullable(),
  }),
  horizonS: z.number(),
  dtS: z.number(),
  ensemble: z.strictObject({
    members: z.number().int(),
    seed: z.string(),
    dtS: z.number(),
    sigma: z.number(),
    growthS: z.number(),
    correlationS: z.number(),
    intervalS: z.number(),
  }),
});
export type ForecastInputs = z.infer<typeof forecastInputsSchema>;

export const forecastPeakSchema = z.strictObject({
  /** deterministic run */
  elevation: z.number(),
  timeMs: z.number(),
  outflow: z.number(),
  outflowTimeMs: z.number(),
  /** the pool leaves the top of the storage table: the peak is a lower bound */
  leftTableAtMs: z.number().nullable(),
  /** ensemble quantiles of the peak elevation */
  p10: z.number(),
  p50: z.number(),
  p90: z.number(),
  /** ensemble members that left the storage table */
  membersAboveTable: z.number().int(),
});
export type ForecastPeak = z.infer<typeof forecastPeakSchema>;

export const thresholdOutlookSchema = z.strictObject({
  id: z.string(),
  label: z.string(),
  kind: z.enum(THRESHOLD_KINDS),
  elevation: z.number(),
  /** first crossing in the deterministic run, null when it does not reach it */
  timeMs: z.number().nullable(),
  leadS: z.number().nullable(),
  alreadyAbove: z.boolean(),
  timeAboveS: z.number(),
  /** fraction of ensemble members whose pool reaches it */
  probability: z.number().min(0).max(1),
});
export type ThresholdOutlook = z.infer<typeof thresholdOutlookSchema>;

export const TIME_LEFT_STATUSES = ['ok', 'past', 'impossible', 'not-needed'] as const;
export type TimeLeftStatus = (typeof TIME_LEFT_STATUSES)[number];

/** "Time left to act": the latest start of the standard plan that keeps the peak at the target. */
export const timeLeftSchema = z.strictObject({
  status: z.enum(TIME_LEFT_STATUSES),
  target: z.number(),
  targetLabel: z.string(),
  plan: z.strictObject({
    label: z.string(),
    gates: z.array(z.string()),
    /** m, the common opening the plan commands */
    opening: z.number(),
  }),
  latestStartMs: z.number().nullable(),
  /** latestStartMs - siteNowMs, s; negative when past */
  timeLeftS: z.number().nullable(),
  peakAtLatest: z.number().nullable(),
  peakIfStartedNow: z.number().nullable(),
  peakWithoutPlan: z.number(),
  message: z.string(),
});
export type TimeLeft = z.infer<typeof timeLeftSchema>;

/** The smallest common gate opening, commanded now, that keeps the peak at the target. */
export const holdNowSchema = z.strictObject({
  status: z.enum(['ok', 'not-needed', 'impossible']),
  target: z.number(),
  gates: z.array(z.string()),
  opening: z.number().nullable(),
  maxOpening: z.number(),
  peakElevation: z.number(),
  peakTimeMs: z.number(),
  message: z.string(),
});
export type HoldNow = z.infer<typeof holdNowSchema>;

export const forecastRunSchema = z.strictObject({
  id: z.number().int(),
  reservoirId: z.string(),
  /** site time of the run (= inputs.siteNowMs) */
  computedAtMs: z.number(),
  trigger: z.enum(FORECAST_TRIGGERS),
  /** what set it off, in words */
  triggerDetail: z.string(),
  definitionVersion: z.number().int(),
  codeVersion: z.strictObject({
    /** the gateway package version */
    gateway: z.string(),
    /** SHA-256 (first 16 hex) of the forecast options: horizon, steps, ensemble, rules, plan */
    options: z.string(),
  }),
  inputs: forecastInputsSchema,
  series: forecastSeriesSchema,
  peak: forecastPeakSchema,
  thresholds: z.array(thresholdOutlookSchema),
  timeLeft: timeLeftSchema,
  holdNow: holdNowSchema,
  notes: z.array(z.string()),
  /** wall ms the computation took */
  durationMs: z.number(),
  caution: z.string(),
});
export type ForecastRun = z.infer<typeof forecastRunSchema>;

/** One line of the run list: enough to find the run a reviewer wants to open. */
export const forecastRunSummarySchema = z.strictObject({
  id: z.number().int(),
  computedAtMs: z.number(),
  trigger: z.enum(FORECAST_TRIGGERS),
  triggerDetail: z.string(),
  definitionVersion: z.number().int(),
  startElevation: z.number(),
  peakElevation: z.number(),
  peakTimeMs: z.number(),
  peakP90: z.number(),
  timeLeftStatus: z.enum(TIME_LEFT_STATUSES),
  latestStartMs: z.number().nullable(),
});
export type ForecastRunSummary = z.infer<typeof forecastRunSummarySchema>;

export const forecastRunListSchema = z.strictObject({
  runs: z.array(forecastRunSummarySchema),
  /** more runs in the range than returned (the most recent `limit` are) */
  truncated: z.boolean(),
  caution: z.string(),
});
export type ForecastRunList = z.infer<typeof forecastRunListSchema>;

/**
 * GET .../forecasts/latest and the live 'forecast' event: the latest run, and why it could not be
 * renewed when the last attempt failed (then the run shown is older than it should be).
 */
export const forecastUpdateSchema = z.strictObject({
  reservoirId: z.string(),
  run: forecastRunSchema.nullable(),
  problem: z.string().nullable(),
  caution: z.string(),
});
export type ForecastUpdate = z.infer<typeof forecastUpdateSchema>;

/**
 * socket.io on the live namespace (/live). Forecasts have a room of their own per reservoir,
 * joined with 'forecast-subscribe' { reservoirId } (ack { ok, error? }; needs 'forecast.read'),
 * after which every run arrives as 'forecast' (a ForecastUpdate), the latest one at once.
 */
export const FORECAST_LIVE_EVENTS = {
  subscribe: 'forecast-subscribe',
  unsubscribe: 'forecast-unsubscribe',
  forecast: 'forecast',
} as const;
