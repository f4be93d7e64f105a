import type uPlot from 'uplot';
import type { ReplayForecast, ReplaySeries } from '@stillwell/shared/replay';

/** The chart's series, in order after x: which scale each uses and how it is drawn. */
export interface ChartSeriesSpec {
  key: string;
  label: string;
  scale: 'level' | 'flow' | 'opening';
  kind: 'observed' | 'band-low' | 'band-mid' | 'band-high';
}

/** Display conversion of a value of the series' SI unit. */
export type Convert = (siValue: number, unit: ReplaySeries['unit']) => number;

const SCALE_OF: Partial<Record<ReplaySeries['role'], ChartSeriesSpec['scale']>> = {
  pool: 'level',
  inflow: 'flow',
  outflow: 'flow',
  'gate-opening': 'opening',
};

/**
 * Aligns the window's series (each on its own times) and the forecast band standing at the
 * moment on one x axis in seconds, as uPlot wants: the union of all times, ascending and unique,
 * each column null where its series has no point.
 */
export function buildChartData(
  series: readonly ReplaySeries[],
  forecast: ReplayForecast | null,
  convert: Convert,
): { specs: ChartSeriesSpec[]; data: uPlot.AlignedData } {
  const shown = series.filter((s) => SCALE_OF[s.role]);
  const specs: ChartSeriesSpec[] = shown.map((s) => ({
    key: s.channel,
    label: s.label,
    scale: SCALE_OF[s.role]!,
    kind: 'observed',
  }));
  const columns = shown.map((s) => ({
    t: s.t,
    v: s.v.map((v) => convert(v, s.unit)),
  }));
  if (forecast) {
    const t = forecast.elevation.map((_, i) => forecast.startMs + i * forecast.stepS * 1000);
    for (const [key, kind, values] of [
      ['p10', 'band-low', forecast.p10],
      ['p50', 'band-mid', forecast.p50],
      ['p90', 'band-high', forecast.p90],
    ] as const) {
      specs.push({ key, label: `Forecast ${key} (as it stood)`, scale: 'level', kind });
      columns.push({ t, v: values.map((v) => convert(v, 'm')) });
    }
  }
  const xs = [...new Set(columns.flatMap((c) => c.t))].sort((a, b) => a - b);
  const index = new Map(xs.map((x, i) => [x, i]));
  const data: (number | null)[][] = columns.map((c) => {
    const col = new Array<number | null>(xs.length).fill(null);
    c.t.forEach((t, i) => (col[index.get(t)!] = c.v[i]!));
    return col;
  });
  return { specs, data: [xs.map((x) => x / 1000), ...data] as uPlot.AlignedData };
}
