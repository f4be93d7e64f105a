import {
  leastSquaresSlope,
  linearTrendForecast,
  persistenceForecast,
  recessionForecast,
  seriesAt,
  seriesFromPoints,
  type FlowPoint,
} from '@stillwell/shared/hydraulics';
import type { ForecastOptions } from './forecast-settings';

export interface ChosenInflow {
  method: 'persistence' | 'linear-trend' | 'recession';
  reason: string;
  /** forecast times (s, same clock as the observations) and flows */
  t: Float64Array;
  q: Float64Array;
  nowFlow: number;
  parameters: Record<string, number>;
  notes: string[];
}

const perHour = (slopePerS: number) => slopePerS * 3600;
const fmt = (v: number, d = 1) => v.toFixed(d);

/**
 * The inflow forecast of a live run, chosen from the observed record (times in s):
 * - rising (the least-squares slope of the last `trendWindowS` above `slopeFractionPerHour` of
 *   the current flow per hour, and above `slopeMinPerHour`): the linear trend, continued for
 *   `trendHoldS` and then held. A straight line continued for a day would forecast any flood to
 *   grow without end; continued no longer than the window it was fitted on, then held, it says
 *   "as fast as now for a while, then no further", which is still no forecast of the peak.
 * - falling by as much: the exponential recession towards the lowest flow of the last
 *   `recessionWindowS`, its constant fitted on the falling limb; persistence if it cannot be fitted.
 * - otherwise: persistence.
 */
export function chooseInflowForecast(
  observed: readonly FlowPoint[],
  nowS: number,
  o: ForecastOptions,
): ChosenInflow {
  if (observed.length === 0) throw new RangeError('no good inflow reading in the record');
  const grid = { now: nowS, horizon: o.horizonS, dt: o.dtS };
  const series = seriesFromPoints(observed);
  const nowFlow = seriesAt(series, nowS);
  const recent = observed.filter((p) => p.t >= nowS - o.inflow.trendWindowS && p.t <= nowS);
  const slope =
    recent.length >= 3
      ? leastSquaresSlope(
          recent.map((p) => p.t),
          recent.map((p) => p.q),
        ).slope
      : NaN;
  const material = Math.max(o.inflow.slopeFractionPerHour * nowFlow, o.inflow.slopeMinPerHour);
  const trendText = Number.isFinite(slope)
    ? `${fmt(perHour(slope))} m3/s per hour over the last ${fmt(o.inflow.trendWindowS / 3600, 0)} h`
    : 'too few recent readings for a trend';

  if (Number.isFinite(slope) && perHour(slope) > material) {
    const trend = linearTrendForecast(observed, { ...grid, window: o.inflow.trendWindowS });
    const hold = Math.round(o.inflow.trendHoldS / o.dtS);
    const q = Float64Array.from(trend.q, (v, k) => (k > hold ? trend.q[hold]! : v));
    return {
      method: 'linear-trend',
      reason: `rising: ${trendText}`,
      t: trend.t,
      q,
      nowFlow,
      parameters: { ...trend.parameters, holdS: o.inflow.trendHoldS },
      notes: [
        ...trend.notes,
        `the trend is continued for ${fmt(o.inflow.trendHoldS / 3600, 0)} h, then held: it cannot foresee the peak`,
      ],
    };
  }
  if (Number.isFinite(slope) && perHour(slope) < -material) {
    const window = observed.filter((p) => p.t >= nowS - o.inflow.recessionWindowS);
    const baseflow = Math.min(...window.map((p) => p.q), nowFlow);
    try {
      const r = recessionForecast(observed, {
        ...grid,
        baseflow,
        window: o.inflow.recessionWindowS,
      });
      return {
        method: 'recession',
        reason: `falling: ${trendText}`,
        t: r.t,
        q: r.q,
        nowFlow,
        parameters: r.parameters,
        notes: r.notes,
      };
    } catch (error) {
      const p = persistenceForecast(observed, grid);
      return {
        method: 'persistence',
        reason: `falling (${trendText}), but no recession could be fitted: ${(error as Error).message}`,
        t: p.t,
        q: p.q,
        nowFlow,
        parameters: p.parameters,
        notes: ['the current inflow is held'],
      };
    }
  }
  const p = persistenceForecast(observed, grid);
  return {
    method: 'persistence',
    reason: `steady: ${trendText}`,
    t: p.t,
    q: p.q,
    nowFlow,
    parameters: p.parameters,
    notes: ['the current inflow is held'],
  };
}
