import { z } from 'zod';
import { piezometerSchema, seepageWeirSchema } from '../reservoirs/definition.js';

/**
 * GET /api/reservoirs/:id/dam-safety: the seepage weirs and piezometers over a site-time range,
 * each reading beside the pool elevation at its time (for the scatter against the pool) and the
 * baseline at the lagged pool (for the plot over time). Columnar; times epoch ms; SI units.
 */
const nullableNumbers = z.array(z.number().nullable());

export const massBalanceResultSchema = z.strictObject({
  fromMs: z.number(),
  toMs: z.number(),
  measuredChange: z.number(),
  predictedChange: z.number(),
  residualFlow: z.number(),
  meanThroughflow: z.number(),
  tolerance: z.number(),
  gauges: z.number().int(),
});

export const weirSeriesSchema = z.strictObject({
  weir: seepageWeirSchema,
  t: z.array(z.number()),
  head: z.array(z.number()),
  /** from the head by the V-notch equation, m3/s */
  flow: z.array(z.number()),
  /** pool elevation at the reading's time, m (null where the pool record has a hole) */
  pool: nullableNumbers,
  /** the baseline flow at the lagged pool, and the limit above which seepage is "rising" */
  baseline: nullableNumbers,
  limit: nullableNumbers,
  /** the steady-state baseline against pool elevation, for the scatter */
  curve: z.array(z.strictObject({ pool: z.number(), flow: z.number() })),
});
export type WeirSeries = z.infer<typeof weirSeriesSchema>;

export const piezometerSeriesSchema = z.strictObject({
  piezometer: piezometerSchema,
  t: z.array(z.number()),
  level: z.array(z.number()),
  pool: nullableNumbers,
  baseline: nullableNumbers,
  curve: z.array(z.strictObject({ pool: z.number(), level: z.number() })),
});
export type PiezometerSeries = z.infer<typeof piezometerSeriesSchema>;

export const damSafetySchema = z.strictObject({
  reservoirId: z.string(),
  definitionVersion: z.number().int(),
  fromMs: z.number(),
  toMs: z.number(),
  pool: z.strictObject({
    channel: z.string().nullable(),
    t: z.array(z.number()),
    v: z.array(z.number()),
  }),
  weirs: z.array(weirSeriesSchema),
  piezometers: z.array(piezometerSeriesSchema),
  /** the latest water balance the alarm engine computed */
  massBalance: massBalanceResultSchema.nullable(),
});
export type DamSafety = z.infer<typeof damSafetySchema>;
