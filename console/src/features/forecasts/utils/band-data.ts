import type { ForecastRun } from '@stillwell/shared/forecasts';
import { toDisplay, type UnitSystem } from '@stillwell/shared/units';

/** How far ahead of now the live chart shows the forecast, s. */
export const FORECAST_AHEAD_S = 12 * 3600;

/** The forecast as the live chart draws it: x in seconds, values in display units. */
export interface ForecastBand {
  t: number[];
  low: number[];
  median: number[];
  high: number[];
  inflow: number[];
  /** how far past the site's now the chart should reach, s */
  aheadS: number;
}

/**
 * The p10-p90 band, the median and the inflow forecast of a run, from its start up to `aheadS`
 * past the site's now, converted to the display units. Values that are not finite are left out
 * with their time, so the band never draws a made-up point.
 */
export function forecastBand(
  run: ForecastRun,
  system: UnitSystem,
  siteNowMs: number,
  aheadS: number,
): ForecastBand {
  const { series } = run;
  const endMs = siteNowMs + aheadS * 1000;
  const length = (v: number) => toDisplay(v, 'length', system).value;
  const flow = (v: number) => toDisplay(v, 'flow', system).value;
  const band: ForecastBand = { t: [], low: [], median: [], high: [], inflow: [], aheadS };
  for (let i = 0; i < series.p50.length; i++) {
    const tMs = series.startMs + i * series.stepS * 1000;
    if (tMs > endMs) break;
    const lo = series.p10[i];
    const mid = series.p50[i];
    const hi = series.p90[i];
    const q = series.inflow[i];
    if (![lo, mid, hi, q].every((v) => typeof v === 'number' && Number.isFinite(v))) continue;
    if (lo === undefined || mid === undefined || hi === undefined || q === undefined) continue;
    band.t.push(tMs / 1000);
    // the band's edges in order whatever the quantiles' rounding did
    band.low.push(length(Math.min(lo, hi)));
    band.median.push(length(mid));
    band.high.push(length(Math.max(lo, hi)));
    band.inflow.push(flow(q));
  }
  return band;
}
