import { z } from 'zod';
import { PRIORITIES, prioritySchema, type Priority } from './priorities.js';

/**
 * Alarm-system performance after ISA-18.2 (IEC 62682) and EEMUA 191. Figures per operator; the
 * rate counts annunciations (alarms presented to the operator: raised while in service).
 *
 * Benchmarks (ISA-18.2 section 16 and EEMUA 191, as the team reads them):
 * - about 1 alarm per 10 minutes per operator is very likely acceptable; about 2 is the most an
 *   operator can manage;
 * - 10 or more alarms in 10 minutes is a flood; under about 1 % of 10-minute periods should be;
 * - a chattering alarm (here 3 or more annunciations of one alarm within a minute) should not exist.
 */
export const TEN_MINUTES_MS = 600_000;
export const ACCEPTABLE_PER_10_MIN = 1;
export const MANAGEABLE_PER_10_MIN = 2;
export const FLOOD_PER_10_MIN = 10;
export const CHATTER_COUNT = 3;
export const CHATTER_WINDOW_MS = 60_000;

export interface Annunciation {
  conditionId: string;
  /** site time, epoch ms */
  timeMs: number;
  priority: Priority;
}

export const alarmPerformanceSchema = z.strictObject({
  fromMs: z.number(),
  toMs: z.number(),
  operators: z.number().int().min(1),
  total: z.number().int(),
  /** per operator */
  averagePer10Min: z.number(),
  /** the most in any 10 minutes (sliding), per operator */
  peakPer10Min: z.number(),
  peakStartMs: z.number().nullable(),
  /** counts in consecutive 10-minute periods from fromMs, per operator */
  periods: z.array(z.number()),
  floodPeriods: z.number().int(),
  /** share of 10-minute periods in flood, 0..1 */
  floodShare: z.number(),
  byPriority: z.record(prioritySchema, z.number().int()),
  mostFrequent: z.array(
    z.strictObject({ conditionId: z.string(), count: z.number().int(), share: z.number() }),
  ),
  chattering: z.array(
    z.strictObject({
      conditionId: z.string(),
      bursts: z.number().int(),
      mostInAMinute: z.number().int(),
    }),
  ),
  verdict: z.strictObject({
    rate: z.enum(['acceptable', 'manageable', 'overloaded']),
    floods: z.boolean(),
    chattering: z.boolean(),
  }),
});
export type AlarmPerformance = z.infer<typeof alarmPerformanceSchema>;

/** The performance figures of the annunciations in [fromMs, toMs). */
export function alarmPerformance(
  all: readonly Annunciation[],
  fromMs: number,
  toMs: number,
  operators = 1,
): AlarmPerformance {
  const events = all
    .filter((e) => e.timeMs >= fromMs && e.timeMs < toMs)
    .sort((a, b) => a.timeMs - b.timeMs);
  const span = Math.max(toMs - fromMs, 1);
  const periods = new Array<number>(Math.max(1, Math.ceil(span / TEN_MINUTES_MS))).fill(0);
  for (const e of events) periods[Math.floor((e.timeMs - fromMs) / TEN_MINUTES_MS)]! += 1;
  let peak = 0;
  let peakStartMs: number | null = null;
  for (let i = 0, j = 0; i < events.length; i++) {
    while (events[i]!.timeMs - events[j]!.timeMs >= TEN_MINUTES_MS) j++;
    if (i - j + 1 > peak) {
      peak = i - j + 1;
      peakStartMs = events[j]!.timeMs;
    }
  }
  const perOperator = (n: number) => n / operators;
  const floodPeriods = periods.filter((n) => perOperator(n) >= FLOOD_PER_10_MIN).length;
  const byPriority = Object.fromEntries(PRIORITIES.map((p) => [p, 0])) as Record<Priority, number>;
  const counts = new Map<string, number[]>();
  for (const e of events) {
    byPriority[e.priority] += 1;
    const list = counts.get(e.conditionId) ?? [];
    list.push(e.timeMs);
    counts.set(e.conditionId, list);
  }
  const mostFrequent = [...counts.entries()]
    .map(([conditionId, times]) => ({
      conditionId,
      count: times.length,
      share: times.length / events.length,
    }))
    .sort((a, b) => b.count - a.count || a.conditionId.localeCompare(b.conditionId))
    .slice(0, 10);
  const chattering = [...counts.entries()].flatMap(([conditionId, times]) => {
    const { bursts, most } = chatterOf(times);
    return bursts > 0 ? [{ conditionId, bursts, mostInAMinute: most }] : [];
  });
  const average = perOperator(events.length) / (span / TEN_MINUTES_MS);
  return {
    fromMs,
    toMs,
    operators,
    total: events.length,
    averagePer10Min: average,
    peakPer10Min: perOperator(peak),
    peakStartMs,
    periods: periods.map(perOperator),
    floodPeriods,
    floodShare: floodPeriods / periods.length,
    byPriority,
    mostFrequent,
    chattering,
    verdict: {
      rate:
        average <= ACCEPTABLE_PER_10_MIN
          ? 'acceptable'
          : average <= MANAGEABLE_PER_10_MIN
            ? 'manageable'
            : 'overloaded',
      floods: perOperator(peak) >= FLOOD_PER_10_MIN,
      chattering: chattering.length > 0,
    },
  };
}

/** Bursts of CHATTER_COUNT or more annunciations within CHATTER_WINDOW_MS (times sorted). */
function chatterOf(times: readonly number[]): { bursts: number; most: number } {
  let bursts = 0;
  let most = 0;
  let inBurst = false;
  for (let i = 0, j = 0; i < times.length; i++) {
    while (times[i]! - times[j]! > CHATTER_WINDOW_MS) j++;
    const n = i - j + 1;
    most = Math.max(most, n);
    if (n >= CHATTER_COUNT && !inBurst) {
      bursts++;
      inBurst = true;
    } else if (n < CHATTER_COUNT) inBurst = false;
  }
  return { bursts, most };
}
