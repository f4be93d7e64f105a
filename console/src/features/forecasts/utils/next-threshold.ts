import type { ForecastRun, ThresholdOutlook } from '@stillwell/shared/forecasts';

/**
 * The next level the forecast pool reaches after the site's now: the earliest first crossing that
 * is still ahead. Levels the pool is already above do not count; null when none is reached
 * within the horizon.
 */
export function nextThreshold(run: ForecastRun, siteNowMs: number): ThresholdOutlook | null {
  const ahead = run.thresholds.filter(
    (t) => !t.alreadyAbove && t.timeMs !== null && t.timeMs >= siteNowMs,
  );
  ahead.sort((a, b) => a.timeMs! - b.timeMs! || a.elevation - b.elevation);
  return ahead[0] ?? null;
}
