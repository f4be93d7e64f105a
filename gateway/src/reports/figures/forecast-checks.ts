import { FORECAST_LEADS_H, type ForecastCheck } from '@stillwell/shared/reports';

export interface StoredRunSummary {
  id: number;
  computedAt: number;
  peakElevation: number;
  peakTime: number;
  peakP90: number;
}

/** A run older than this before its mark is not taken as "the forecast at" the mark. */
export const RUN_SEARCH_MS = 3_600_000;

/**
 * The forecast operators had at 6, 3 and 1 hours before the actual peak: the newest stored run
 * computed at or before the mark (and within the hour before it), against what happened.
 */
export function forecastChecks(
  runs: readonly StoredRunSummary[],
  actual: { value: number; t: number } | null,
  leads: readonly number[] = FORECAST_LEADS_H,
): ForecastCheck[] {
  return leads.map((leadHours) => {
    const none: ForecastCheck = {
      leadHours,
      runId: null,
      computedAt: null,
      forecastPeak: null,
      forecastPeakTime: null,
      forecastP90: null,
      error: null,
      timingError: null,
    };
    if (!actual) return none;
    const mark = actual.t - leadHours * 3_600_000;
    let run: StoredRunSummary | undefined;
    for (const r of runs) {
      if (r.computedAt > mark || r.computedAt < mark - RUN_SEARCH_MS) continue;
      if (
        !run ||
        r.computedAt > run.computedAt ||
        (r.computedAt === run.computedAt && r.id > run.id)
      )
        run = r;
    }
    if (!run) return none;
    return {
      leadHours,
      runId: run.id,
      computedAt: run.computedAt,
      forecastPeak: run.peakElevation,
      forecastPeakTime: run.peakTime,
      forecastP90: run.peakP90,
      error: run.peakElevation - actual.value,
      timingError: run.peakTime - actual.t,
    };
  });
}
