import { routeStorageIndication } from '../route.js';
import type { RoutingOptions, RoutingResult } from '../routing-types.js';
import type { GateSchedule } from '../schedule.js';
import { timeToThresholds, type LevelThreshold, type ThresholdCrossing } from './thresholds.js';

export interface ScheduleSummary {
  peakElevation: number;
  peakElevationTime: number;
  peakOutflow: number;
  peakOutflowTime: number;
  finalElevation: number;
  /** volume released over the run, m3 */
  releasedVolume: number;
  /** largest change of the release between steps, m3/s per s (pool-driven changes included) */
  maxReleaseRate: number;
  thresholds: ThresholdCrossing[];
  throttled: boolean;
  leftTableAt: number | null;
}

export interface ScheduleComparison {
  a: ScheduleSummary;
  b: ScheduleSummary;
  /** b minus a for the numeric headline figures */
  difference: {
    peakElevation: number;
    peakElevationTime: number;
    peakOutflow: number;
    finalElevation: number;
    releasedVolume: number;
  };
  results: { a: RoutingResult; b: RoutingResult };
}

export function summarize(
  r: RoutingResult,
  thresholds: readonly LevelThreshold[] = [],
): ScheduleSummary {
  let rate = 0;
  for (let i = 1; i < r.outflow.length; i++) {
    rate = Math.max(
      rate,
      Math.abs(r.outflow[i]! - r.outflow[i - 1]!) / (r.time[i]! - r.time[i - 1]!),
    );
  }
  return {
    peakElevation: r.peakElevation,
    peakElevationTime: r.peakElevationTime,
    peakOutflow: r.peakOutflow,
    peakOutflowTime: r.peakOutflowTime,
    finalElevation: r.elevation[r.elevation.length - 1]!,
    releasedVolume: r.massBalance.outflowVolume,
    maxReleaseRate: rate,
    thresholds: timeToThresholds(r, thresholds),
    throttled: r.throttled,
    leftTableAt: r.leftTableAt,
  };
}

/**
 * Routes the same inflow under two schedules (each added to the options' own schedule, both under
 * the same release limits) and sets them side by side.
 */
export function compareSchedules(
  o: RoutingOptions,
  a: GateSchedule,
  b: GateSchedule,
  thresholds: readonly LevelThreshold[] = [],
): ScheduleComparison {
  const base = o.schedule ?? [];
  const ra = routeStorageIndication({ ...o, aboveTable: 'stop', schedule: [...base, ...a] });
  const rb = routeStorageIndication({ ...o, aboveTable: 'stop', schedule: [...base, ...b] });
  const sa = summarize(ra, thresholds);
  const sb = summarize(rb, thresholds);
  return {
    a: sa,
    b: sb,
    difference: {
      peakElevation: sb.peakElevation - sa.peakElevation,
      peakElevationTime: sb.peakElevationTime - sa.peakElevationTime,
      peakOutflow: sb.peakOutflow - sa.peakOutflow,
      finalElevation: sb.finalElevation - sa.finalElevation,
      releasedVolume: sb.releasedVolume - sa.releasedVolume,
    },
    results: { a: ra, b: rb },
  };
}
