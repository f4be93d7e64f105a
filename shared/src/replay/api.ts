import { z } from 'zod';
import { PREVAILING_AUTHORITY } from '../forecasts/api.js';
import { alarmEventSchema } from '../alarms/api.js';
import { DISPLAY_STATES } from '../alarms/lifecycle.js';
import { prioritySchema } from '../alarms/priorities.js';
import { CHANNEL_ROLES } from '../reservoirs/definition.js';
import { qualitySchema } from '../telemetry/message.js';
import { UNITS } from '../units/units.js';

/**
 * Shapes of the replay API (GET /api/reservoirs/:id/replay/...). Times are epoch ms of site time
 * unless named otherwise; values in the channel's SI unit.
 */

/** Said wherever a replayed forecast is shown: it is what operators saw, not a verdict. */
export const REPLAY_FORECAST_CAUTION =
  'The forecast as it stood at that moment, from the stored run: decision support then, not a ' +
  `measurement; ${PREVAILING_AUTHORITY} prevailed.`;

/**
 * raw: stored readings; minute: one-minute aggregates (min and max of each minute); hour: hourly
 * roll-ups of those, for windows too long to read minute by minute.
 */
export const REPLAY_RESOLUTIONS = ['raw', 'minute', 'hour'] as const;
export type ReplayResolution = (typeof REPLAY_RESOLUTIONS)[number];

export const REPLAY_BUCKETS = { min: 10, max: 5000, default: 1000 } as const;

/** One channel over the window, columnar and downsampled (each bucket's min and max kept). */
export const replaySeriesSchema = z.strictObject({
  channel: z.string(),
  label: z.string(),
  role: z.enum(CHANNEL_ROLES),
  unit: z.enum(UNITS),
  t: z.array(z.number()),
  v: z.array(z.number()),
  q: z.array(qualitySchema),
  /** points read before downsampling (readings, or minute extremes) */
  sourcePoints: z.number().int(),
});
export type ReplaySeries = z.infer<typeof replaySeriesSchema>;

export const replayForecastMarkSchema = z.strictObject({
  id: z.number().int(),
  computedAtMs: z.number(),
});
export type ReplayForecastMark = z.infer<typeof replayForecastMarkSchema>;

/** An alarm's state at one moment of the replay, folded from its stored events. */
export const replayAlarmStateSchema = z.strictObject({
  conditionId: z.string(),
  priority: prioritySchema,
  state: z.enum(DISPLAY_STATES),
  active: z.boolean(),
  acknowledged: z.boolean(),
  /** site time of the last event that changed it */
  sinceMs: z.number(),
  /** what that event said (the condition's message, a comment or a reason) */
  text: z.string().nullable(),
  actor: z.string().nullable(),
});
export type ReplayAlarmState = z.infer<typeof replayAlarmStateSchema>;

/** GET .../replay/window: the chart data and the alarm record of a time window. */
export const replayWindowSchema = z.strictObject({
  reservoirId: z.string(),
  fromMs: z.number(),
  toMs: z.number(),
  buckets: z.number().int(),
  resolution: z.enum(REPLAY_RESOLUTIONS),
  /** why this resolution, in words */
  resolutionReason: z.string(),
  series: z.array(replaySeriesSchema),
  /** alarms standing when the window opens (state not normal) */
  alarmsAtStart: z.array(replayAlarmStateSchema),
  /** every alarm event in the window, oldest first */
  alarmEvents: z.array(alarmEventSchema),
  /** the forecast runs in the window, oldest first, and the one standing at its start */
  forecastRuns: z.array(replayForecastMarkSchema),
});
export type ReplayWindow = z.infer<typeof replayWindowSchema>;

/** recorded: the entry names the site time itself; estimated: from its wall time (docs/replay.md). */
export const ENTRY_TIME_SOURCES = ['recorded', 'estimated'] as const;

/** A logbook entry placed on the replay's site-time axis. */
export const replayEntrySchema = z.strictObject({
  seq: z.number().int(),
  siteTimeMs: z.number(),
  timeSource: z.enum(ENTRY_TIME_SOURCES),
  /** the wall-clock time the logbook stamped, ISO 8601 */
  time: z.string(),
  kind: z.string(),
  actorName: z.string().nullable(),
  payload: z.record(z.string(), z.unknown()),
});
export type ReplayEntry = z.infer<typeof replayEntrySchema>;

/** GET .../replay/entries: one page, in site-time order; `next` continues after the last. */
export const replayEntryPageSchema = z.strictObject({
  entries: z.array(replayEntrySchema),
  /** total in the window */
  total: z.number().int(),
  next: z.string().nullable(),
});
export type ReplayEntryPage = z.infer<typeof replayEntryPageSchema>;

/** GET .../replay/forecast-runs/:runId: the band of one stored run, as it was pushed. */
export const replayForecastSchema = z.strictObject({
  id: z.number().int(),
  computedAtMs: z.number(),
  trigger: z.string(),
  startMs: z.number(),
  stepS: z.number(),
  elevation: z.array(z.number()),
  p10: z.array(z.number()),
  p50: z.array(z.number()),
  p90: z.array(z.number()),
  peak: z.strictObject({ elevation: z.number(), timeMs: z.number(), p90: z.number() }),
  timeLeftStatus: z.string(),
  latestStartMs: z.number().nullable(),
  caution: z.string(),
});
export type ReplayForecast = z.infer<typeof replayForecastSchema>;

export const REPLAY_EVENT_KINDS = ['high-pool', 'emergency', 'record'] as const;
export type ReplayEventKind = (typeof REPLAY_EVENT_KINDS)[number];

/** A window worth replaying, found in the record (see docs/replay.md for the rules). */
export const replayEventSchema = z.strictObject({
  id: z.string(),
  kind: z.enum(REPLAY_EVENT_KINDS),
  label: z.string(),
  fromMs: z.number(),
  toMs: z.number(),
  /** still going on at the site's now */
  ongoing: z.boolean(),
  peak: z.strictObject({ value: z.number(), timeMs: z.number() }).nullable(),
});
export type ReplayEvent = z.infer<typeof replayEventSchema>;

export const replayEventListSchema = z.strictObject({
  events: z.array(replayEventSchema),
  /** the site's now when the list was made */
  nowMs: z.number(),
});
export type ReplayEventList = z.infer<typeof replayEventListSchema>;
