import { z } from 'zod';
import { channelIdSchema, idSchema } from '../telemetry/message.js';
import { prioritySchema } from './priorities.js';

/**
 * The alarm limits a reservoir definition may carry (its optional `alarms` section). Each section
 * given replaces the default section as a whole (settings.ts holds the defaults and docs/alarms.md
 * the reasons for them), so a definition states complete, reviewable limits. Times are site-time
 * seconds; elevations m, flows m3/s, rates m/h.
 */

const seconds = z.number().min(0);
const positiveSeconds = z.number().positive();

/** One pool threshold of the definition as an alarm. Thresholds not listed get defaults by kind. */
export const poolLevelAlarmSchema = z.strictObject({
  thresholdId: idSchema,
  priority: prioritySchema,
  /** the pool must fall this far below the threshold before the alarm clears, m */
  deadband: z.number().min(0),
  /** the pool must stay above the threshold this long before the alarm is raised */
  onDelayS: seconds,
});
export type PoolLevelAlarm = z.infer<typeof poolLevelAlarmSchema>;

export const rateOfRiseLimitsSchema = z.strictObject({
  /** m/h */
  limit: z.number().positive(),
  /** least-squares slope of the pool over this much time */
  windowS: positiveSeconds,
  deadband: z.number().min(0),
  onDelayS: seconds,
  /** first filling: a stricter limit over a longer window replaces the usual one while active */
  firstFilling: z.strictObject({
    active: z.boolean(),
    limit: z.number().positive(),
    windowS: positiveSeconds,
  }),
});
export type RateOfRiseLimits = z.infer<typeof rateOfRiseLimitsSchema>;

export const gaugeDisagreementLimitsSchema = z.strictObject({
  /** m between the means of the first two pool gauges */
  tolerance: z.number().positive(),
  deadband: z.number().min(0),
  /** each gauge is averaged over this much time before comparing */
  windowS: positiveSeconds,
  onDelayS: seconds,
});
export type GaugeDisagreementLimits = z.infer<typeof gaugeDisagreementLimitsSchema>;

/** A channel that must not stay within `band` of one value for longer than `afterS`. */
export const frozenCheckSchema = z.strictObject({
  channel: channelIdSchema,
  band: z.number().min(0),
  afterS: positiveSeconds,
});
export type FrozenCheck = z.infer<typeof frozenCheckSchema>;

export const outOfRangeLimitsSchema = z.strictObject({
  /** this many out-of-range messages for one channel ... */
  count: z.number().int().min(1),
  /** ... within this much time is a burst */
  windowS: positiveSeconds,
  /** the alarm clears after this long without one */
  clearAfterS: positiveSeconds,
});
export type OutOfRangeLimits = z.infer<typeof outOfRangeLimitsSchema>;

export const massBalanceLimitsSchema = z.strictObject({
  /** the storage change is compared over this sliding window */
  windowS: positiveSeconds,
  /** the pool at each end of the window is the mean over this much time (gauge noise) */
  endAverageS: positiveSeconds,
  /** residual tolerance: this flow, m3/s ... */
  toleranceFlow: z.number().positive(),
  /** ... plus this fraction of the mean of inflow + outflow over the window (gauge error) */
  toleranceFraction: z.number().min(0).max(1),
  /** clears below this fraction of the tolerance */
  clearFraction: z.number().gt(0).max(1),
  /** the residual must persist this long */
  onDelayS: seconds,
  /** a hole longer than this in a series leaves the window unjudged */
  maxGapS: positiveSeconds,
  /** how often the window is evaluated */
  everyS: positiveSeconds,
});
export type MassBalanceLimits = z.infer<typeof massBalanceLimitsSchema>;

export const forecastLimitsSchema = z.strictObject({
  /** threshold ids whose forecast crossing is an alarm */
  thresholds: z.array(idSchema),
  /** crossings further ahead than this are not yet alarms */
  horizonS: positiveSeconds,
  /** "time left to act" below this is an alarm */
  timeLeftMarginS: positiveSeconds,
  /** it clears above the margin plus this */
  timeLeftDeadbandS: seconds,
  /**
   * a forecast alarm clears only after the forecasts have said so for this long: runs a few
   * minutes apart can flip when the pool sits at a level (default 1800)
   */
  clearAfterS: seconds.optional(),
});
export type ForecastLimits = z.infer<typeof forecastLimitsSchema>;

export const seepageLimitsSchema = z.strictObject({
  onDelayS: seconds,
  /** clears below the limit less this fraction of it */
  deadbandFraction: z.number().min(0).max(1),
});
export type SeepageLimits = z.infer<typeof seepageLimitsSchema>;

export const piezometerLimitsSchema = z.strictObject({
  onDelayS: seconds,
  /** m */
  deadband: z.number().min(0),
});
export type PiezometerLimits = z.infer<typeof piezometerLimitsSchema>;

export const alarmLimitsSchema = z.strictObject({
  poolLevels: z.array(poolLevelAlarmSchema).optional(),
  rateOfRise: rateOfRiseLimitsSchema.optional(),
  gaugeDisagreement: gaugeDisagreementLimitsSchema.optional(),
  frozen: z.array(frozenCheckSchema).optional(),
  outOfRange: outOfRangeLimitsSchema.optional(),
  massBalance: massBalanceLimitsSchema.optional(),
  forecast: forecastLimitsSchema.optional(),
  seepage: seepageLimitsSchema.optional(),
  piezometers: piezometerLimitsSchema.optional(),
  /** the longest an alarm may be shelved, s */
  shelveMaxS: positiveSeconds.optional(),
});
export type AlarmLimits = z.infer<typeof alarmLimitsSchema>;
