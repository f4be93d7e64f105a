import type uPlot from 'uplot';
import type { ReadingSeries } from '@stillwell/shared/telemetry';

export interface ChartSeriesInput {
  series: ReadingSeries | undefined;
  /** SI value -> the value drawn (display units) */
  toDisplay: (siValue: number) => number;
}

/**
 * Turns columnar series into uPlot's aligned arrays: x in seconds, ascending and unique across
 * all series. Where a series has no point at an x the value is undefined (uPlot joins across it);
 * a bad reading becomes null, a gap, so it is never drawn as if it were good.
 */
export function toAlignedData(inputs: readonly ChartSeriesInput[]): uPlot.AlignedData {
  const cleaned = inputs.map(({ series }) =>
    series ? latestPerTime(series) : new Map<number, Point>(),
  );

  const times = new Set<number>();
  for (const points of cleaned) for (const t of points.keys()) times.add(t);
  const xsMs = [...times].sort((a, b) => a - b);
  const index = new Map(xsMs.map((t, i) => [t, i] as const));

  const ys = inputs.map(({ toDisplay }, s) => {
    const column: (number | null | undefined)[] = new Array<undefined>(xsMs.length).fill(undefined);
    for (const [t, point] of cleaned[s] ?? []) {
      const i = index.get(t);
      if (i === undefined) continue;
      column[i] = point.q === 'bad' || !Number.isFinite(point.v) ? null : toDisplay(point.v);
    }
    return column;
  });

  return [xsMs.map((t) => t / 1000), ...ys];
}

interface Point {
  v: number;
  q: ReadingSeries['q'][number];
}

/** One point per time; where a time repeats, the later entry is the newer word on it. */
function latestPerTime(series: ReadingSeries): Map<number, Point> {
  const points = new Map<number, Point>();
  series.t.forEach((t, i) => {
    const v = series.v[i];
    const q = series.q[i];
    if (v === undefined || q === undefined || !Number.isFinite(t)) return;
    points.set(t, { v, q });
  });
  return points;
}

/** A forecast's columns as the chart takes them (display units, x in s). */
export interface ForecastColumns {
  t: readonly number[];
  low: readonly number[];
  median: readonly number[];
  high: readonly number[];
  inflow: readonly number[];
}

/**
 * The observed columns [x, pool, inflow] with the forecast's four after them, on one ascending x:
 * where a series has no point at an x its value is undefined (joined across, never a gap that
 * looks like bad data). Without a forecast its columns are all undefined.
 */
export function withForecast(
  observed: uPlot.AlignedData,
  forecast: ForecastColumns | null,
): uPlot.AlignedData {
  const [xs, ...columns] = observed;
  const fx = forecast?.t ?? [];
  const times = [...new Set([...xs, ...fx])].sort((a, b) => a - b);
  const index = new Map(times.map((t, i) => [t, i] as const));
  const place = (x: ArrayLike<number>, ys: ArrayLike<number | null | undefined>) => {
    const out: (number | null | undefined)[] = new Array<undefined>(times.length).fill(undefined);
    for (let i = 0; i < x.length; i++) {
      const k = index.get(x[i]!);
      if (k !== undefined) out[k] = ys[i];
    }
    return out;
  };
  const observedColumns = columns.map((c) => place(xs, c));
  const forecastColumns = forecast
    ? [forecast.low, forecast.median, forecast.high, forecast.inflow].map((c) => place(fx, c))
    : [0, 1, 2, 3].map(() => new Array<undefined>(times.length).fill(undefined));
  return [times, ...observedColumns, ...forecastColumns];
}
