import { z } from 'zod';
import { THRESHOLD_KINDS } from '../reservoirs/definition.js';
import { TABLE_LIMITS } from './tables.js';

/**
 * What-if: route an inflow hydrograph through the reservoir under a gate schedule. Times are
 * seconds from the start of the run (the site's now when it was asked, unless an uploaded
 * hydrograph carries date-times: then its first point). The row checks are in tables.ts.
 */

export const flowRowSchema = z.strictObject({ t: z.number(), q: z.number() });
export type FlowRow = z.infer<typeof flowRowSchema>;

export const scheduleRowSchema = z.strictObject({
  time: z.number(),
  id: z.string(),
  target: z.number(),
});
export type ScheduleRow = z.infer<typeof scheduleRowSchema>;

export const openingRowSchema = z.strictObject({ id: z.string(), opening: z.number() });
export type OpeningRow = z.infer<typeof openingRowSchema>;

export const WHAT_IF_LIMITS = {
  minDurationS: 600,
  maxDurationS: 7 * 86_400,
  minDtS: 10,
  maxDtS: 900,
  /** default duration when the hydrograph is shorter */
  defaultDurationS: 24 * 3600,
  csvChars: 1_000_000,
} as const;

/**
 * The inflow is given either as rows (`inflow`) or as the text of a CSV file (`inflowCsv`: a header
 * row with time and flow columns, see parseHydrographCsv), never both. Flat on purpose: every
 * problem message then starts with the field's own name ("inflow row 3 (t): ...").
 */
const runCommon = {
  inflow: z.array(flowRowSchema).max(TABLE_LIMITS.flowRows).optional(),
  inflowCsv: z.string().max(WHAT_IF_LIMITS.csvChars).optional(),
  /** unit of numeric times in the CSV (default s) */
  inflowTimeUnit: z.enum(['s', 'min', 'h']).optional(),
  /** pool elevation at the start, m (default: the current pool) */
  startElevation: z.number().optional(),
  /** openings at the start (default: the current readings; a control not listed is closed) */
  initialOpenings: z.array(openingRowSchema).max(64).optional(),
  /** length of the run, s (default: the hydrograph's span, at least 24 h) */
  durationS: z
    .number()
    .min(WHAT_IF_LIMITS.minDurationS)
    .max(WHAT_IF_LIMITS.maxDurationS)
    .optional(),
  /** routing step, s (default 60) */
  dtS: z.number().min(WHAT_IF_LIMITS.minDtS).max(WHAT_IF_LIMITS.maxDtS).optional(),
};

export const whatIfRequestSchema = z.strictObject({
  ...runCommon,
  schedule: z.array(scheduleRowSchema).max(TABLE_LIMITS.scheduleRows),
});
export type WhatIfRequest = z.infer<typeof whatIfRequestSchema>;

export const compareRequestSchema = z.strictObject({
  ...runCommon,
  labelA: z.string().min(1).max(80),
  scheduleA: z.array(scheduleRowSchema).max(TABLE_LIMITS.scheduleRows),
  labelB: z.string().min(1).max(80),
  scheduleB: z.array(scheduleRowSchema).max(TABLE_LIMITS.scheduleRows),
});
export type CompareRequest = z.infer<typeof compareRequestSchema>;

/** Routed series, columnar; t in s from the start. */
export const routedSeriesSchema = z.strictObject({
  t: z.array(z.number()),
  inflow: z.array(z.number()),
  elevation: z.array(z.number()),
  outflow: z.array(z.number()),
});
export type RoutedSeries = z.infer<typeof routedSeriesSchema>;

export const thresholdCrossingSchema = z.strictObject({
  id: z.string(),
  label: z.string(),
  kind: z.enum(THRESHOLD_KINDS),
  elevation: z.number(),
  /** s from the start of the first crossing, null when not reached */
  timeS: z.number().nullable(),
  alreadyAbove: z.boolean(),
  timeAboveS: z.number(),
});
export type ThresholdCrossingView = z.infer<typeof thresholdCrossingSchema>;

export const routeSummarySchema = z.strictObject({
  peakElevation: z.number(),
  peakElevationTimeS: z.number(),
  peakOutflow: z.number(),
  peakOutflowTimeS: z.number(),
  finalElevation: z.number(),
  /** m3 */
  releasedVolume: z.number(),
  /** largest change of the release between steps, m3/s per s */
  maxReleaseRate: z.number(),
  thresholds: z.array(thresholdCrossingSchema),
  /** s from the start when the pool left the storage table (run stopped there), or null */
  leftTableAtS: z.number().nullable(),
});
export type RouteSummary = z.infer<typeof routeSummarySchema>;

const resultCommon = {
  /** epoch ms (site time) of t = 0 */
  startMs: z.number(),
  startElevation: z.number(),
  initialOpenings: z.record(z.string(), z.number()),
  durationS: z.number(),
  dtS: z.number(),
  definitionVersion: z.number().int(),
  notes: z.array(z.string()),
  caution: z.string(),
};

export const whatIfResponseSchema = z.strictObject({
  ...resultCommon,
  series: routedSeriesSchema,
  summary: routeSummarySchema,
});
export type WhatIfResponse = z.infer<typeof whatIfResponseSchema>;

export const compareSideSchema = z.strictObject({
  label: z.string(),
  series: routedSeriesSchema,
  summary: routeSummarySchema,
});
export type CompareSide = z.infer<typeof compareSideSchema>;

export const compareResponseSchema = z.strictObject({
  ...resultCommon,
  a: compareSideSchema,
  b: compareSideSchema,
  /** b minus a */
  difference: z.strictObject({
    peakElevation: z.number(),
    peakElevationTimeS: z.number(),
    peakOutflow: z.number(),
    finalElevation: z.number(),
    releasedVolume: z.number(),
  }),
});
export type CompareResponse = z.infer<typeof compareResponseSchema>;
