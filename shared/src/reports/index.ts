import { z } from 'zod';
import { PREVAILING_AUTHORITY } from '../forecasts/api.js';

/**
 * Event reports: the request for a window, the job that builds it, and the report's figures as
 * the JSON result carries them. Times are UTC epoch ms of site time unless named ISO.
 */

/** The longest window a report may cover (a long storm and its recession), ms. */
export const REPORT_MAX_WINDOW_MS = 31 * 24 * 3_600_000;
/** How far before the actual peak the forecast comparison looks, hours. */
export const FORECAST_LEADS_H = [6, 3, 1] as const;
export const REPORT_FORMATS = ['pdf', 'json', 'csv'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/**
 * The decision-support caution every report carries (PRODUCT.md: a forecast is never certainty).
 */
export const REPORT_CAUTION =
  'This report is decision support drawn from the stored record. Forecasts in it were estimates, ' +
  `never certainty; ${PREVAILING_AUTHORITY} prevail over anything shown here.`;

const isoTime = z.iso.datetime({ offset: true, error: 'an ISO 8601 time with a zone' });

export const createReportRequestSchema = z
  .strictObject({
    from: isoTime,
    to: isoTime,
    /** what to build; the CSV of a long window can be large, so it is asked for */
    formats: z
      .array(z.enum(REPORT_FORMATS))
      .min(1, 'ask for at least one format')
      .default(['pdf', 'json', 'csv']),
  })
  .superRefine((r, ctx) => {
    const from = Date.parse(r.from);
    const to = Date.parse(r.to);
    if (from >= to) ctx.addIssue({ code: 'custom', path: ['from'], message: 'must be before to' });
    else if (to - from > REPORT_MAX_WINDOW_MS)
      ctx.addIssue({
        code: 'custom',
        path: ['to'],
        message: `the window may be at most ${REPORT_MAX_WINDOW_MS / 86_400_000} days long`,
      });
  });
export type CreateReportRequest = z.input<typeof createReportRequestSchema>;

export const REPORT_STAGES = [
  'queued',
  'readings',
  'forecasts',
  'decisions',
  'notices',
  'alarms',
  'logbook',
  'charts',
  'pdf',
  'csv',
  'done',
  'failed',
] as const;
export const reportStageSchema = z.enum(REPORT_STAGES);
export type ReportStage = z.infer<typeof reportStageSchema>;

/** What the console calls each stage. */
export const REPORT_STAGE_LABELS: Readonly<Record<ReportStage, string>> = {
  queued: 'Waiting to start',
  readings: 'Reading the gauges',
  forecasts: 'Comparing forecasts',
  decisions: 'Tracing gate orders',
  notices: 'Checking notices',
  alarms: 'Counting alarms',
  logbook: 'Verifying the logbook',
  charts: 'Drawing charts',
  pdf: 'Writing the PDF',
  csv: 'Writing the CSV',
  done: 'Ready',
  failed: 'Failed',
};

export const reportJobSchema = z.strictObject({
  id: z.string(),
  reservoirId: z.string(),
  from: z.string(),
  to: z.string(),
  formats: z.array(z.enum(REPORT_FORMATS)),
  stage: reportStageSchema,
  /** 0-100 */
  percent: z.number().min(0).max(100),
  /** rows written so far and in all, while the CSV is written */
  rows: z.strictObject({ done: z.number().int(), total: z.number().int() }).nullable(),
  error: z.string().nullable(),
  createdAt: z.string(),
  finishedAt: z.string().nullable(),
});
export type ReportJob = z.infer<typeof reportJobSchema>;

const point = z.strictObject({ t: z.number(), v: z.number() });

export const peakSchema = z.strictObject({ channel: z.string(), value: z.number(), t: z.number() });
export type Peak = z.infer<typeof peakSchema>;

export const reportSummarySchema = z.strictObject({
  poolChannel: z.string().nullable(),
  inflowChannel: z.string().nullable(),
  outflowChannel: z.string().nullable(),
  peakPool: peakSchema.nullable(),
  peakInflow: peakSchema.nullable(),
  peakOutflow: peakSchema.nullable(),
  /** the largest 30-minute least-squares slope of the pool, m/h, and the reading it ends at */
  maxRateOfRise: z.strictObject({ value: z.number(), t: z.number() }).nullable(),
  /** readings in the window, every channel, every quality */
  readingCount: z.number().int(),
  suspectCount: z.number().int(),
  badCount: z.number().int(),
});
export type ReportSummary = z.infer<typeof reportSummarySchema>;

export const forecastCheckSchema = z.strictObject({
  leadHours: z.number(),
  /** the newest run computed at or before peak - lead; null when there was none */
  runId: z.number().int().nullable(),
  computedAt: z.number().nullable(),
  forecastPeak: z.number().nullable(),
  forecastPeakTime: z.number().nullable(),
  forecastP90: z.number().nullable(),
  /** forecast - actual, m */
  error: z.number().nullable(),
  /** forecast peak time - actual peak time, ms */
  timingError: z.number().nullable(),
});
export type ForecastCheck = z.infer<typeof forecastCheckSchema>;

export const timelineStepSchema = z.strictObject({
  kind: z.string(),
  /** site time of the step, epoch ms */
  t: z.number(),
  actor: z.string().nullable(),
  /** ms since the previous step of the same order; null for the first */
  sincePrevious: z.number().nullable(),
  logbookSeq: z.number().int(),
});
export const orderTimelineSchema = z.strictObject({
  orderId: z.number().int(),
  state: z.string(),
  emergency: z.boolean(),
  reason: z.string(),
  steps: z.array(timelineStepSchema),
  /** draft to the step that confirmed the gates in position, ms; null if never confirmed */
  draftToConfirmation: z.number().nullable(),
});
export type OrderTimeline = z.infer<typeof orderTimelineSchema>;

export const noticeLeadSchema = z.strictObject({
  noticeId: z.string(),
  orderId: z.string(),
  zoneName: z.string(),
  contactName: z.string(),
  /** site time the message went to the mail server; null if never sent */
  sentAt: z.number().nullable(),
  /** the release start it warned of: the order's execution, else the notice's planned start */
  releaseAt: z.number(),
  neededS: z.number(),
  /** releaseAt - sentAt, s; null if never sent */
  gotS: z.number().nullable(),
  /** gotS < neededS (or never sent) */
  short: z.boolean(),
  acknowledgedAt: z.number().nullable(),
});
export type NoticeLead = z.infer<typeof noticeLeadSchema>;

export const alarmFigureSchema = z.strictObject({
  conditionId: z.string(),
  label: z.string(),
  priority: z.string(),
  /** raises in the window */
  raised: z.number().int(),
  acknowledged: z.number().int(),
  /** raise to acknowledgement of each acknowledged raise, ms */
  timesToAck: z.array(z.number()),
  medianToAck: z.number().nullable(),
  maxToAck: z.number().nullable(),
});
export type AlarmFigure = z.infer<typeof alarmFigureSchema>;

export const eventReportSchema = z.strictObject({
  reservoirId: z.string(),
  reservoirName: z.string(),
  from: z.number(),
  to: z.number(),
  generatedAt: z.string(),
  /** the demo's invented scenario, not a real event */
  demo: z.boolean(),
  caution: z.string(),
  thresholds: z.array(z.strictObject({ label: z.string(), elevation: z.number() })),
  summary: reportSummarySchema,
  forecasts: z.array(forecastCheckSchema),
  orders: z.array(orderTimelineSchema),
  notices: z.array(noticeLeadSchema),
  alarms: z.strictObject({
    raised: z.number().int(),
    acknowledged: z.number().int(),
    medianToAck: z.number().nullable(),
    byCondition: z.array(alarmFigureSchema),
  }),
  logbook: z.strictObject({
    ok: z.boolean(),
    count: z.number().int(),
    headSeq: z.number().int().nullable(),
    headHash: z.string().nullable(),
    checkedAt: z.string(),
    problem: z.string().nullable(),
  }),
  /** chart series (min-max downsampled), site epoch ms */
  charts: z.strictObject({
    pool: z.array(point),
    inflow: z.array(point),
    outflow: z.array(point),
  }),
});
export type EventReport = z.infer<typeof eventReportSchema>;

/** The demo storm's window, offered by the gateway in demo mode. */
export const reportWindowSchema = z.strictObject({ from: z.string(), to: z.string() });
export type ReportWindow = z.infer<typeof reportWindowSchema>;

/** The median of a list of numbers (null when empty). */
export function median(values: readonly number[]): number | null {
  if (!values.length) return null;
  const s = [...values].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
