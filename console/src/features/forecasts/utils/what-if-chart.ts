import type uPlot from 'uplot';
import type { CompareResponse } from '@stillwell/shared/forecasts';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { toDisplay, type UnitSystem } from '@stillwell/shared/units';
import { drawLines, type ChartLine } from '../../telemetry/components/chart-options';
import { levelMarks, levelRange } from '../../telemetry/utils/thresholds';
import { dataInk, fonts, ink, surface, accent } from '../../../theme';

/** The routed columns as the two result charts draw them: x in hours from the start. */
export interface WhatIfChartData {
  /** x, pool A, pool B (display units) */
  elevation: uPlot.AlignedData;
  /** x, inflow, outflow A, outflow B (display units) */
  flow: uPlot.AlignedData;
  /** display units: every threshold, the crest and both pools */
  levelRange: [number, number];
}

/**
 * A comparison's two routed series on one x (the union of their times: a run that left the
 * storage table stops early, and its columns are undefined from there on, never zero).
 */
export function whatIfChartData(
  result: CompareResponse,
  definition: ReservoirDefinition,
  system: UnitSystem,
): WhatIfChartData {
  const { a, b } = result;
  const times = [...new Set([...a.series.t, ...b.series.t])].sort((x, y) => x - y);
  const index = new Map(times.map((t, i) => [t, i] as const));
  const length = (v: number) => toDisplay(v, 'length', system).value;
  const flow = (v: number) => toDisplay(v, 'flow', system).value;
  const place = (ts: readonly number[], vs: readonly number[], convert: (v: number) => number) => {
    const out: (number | undefined)[] = new Array<undefined>(times.length).fill(undefined);
    ts.forEach((t, i) => {
      const v = vs[i];
      const k = index.get(t);
      if (k !== undefined && v !== undefined && Number.isFinite(v)) out[k] = convert(v);
    });
    return out;
  };
  const longer = a.series.t.length >= b.series.t.length ? a : b;
  const peaks = [a.summary.peakElevation, b.summary.peakElevation, result.startElevation];
  const [lo, hi] = levelRange(definition, null);
  return {
    elevation: [
      times.map((t) => t / 3600),
      place(a.series.t, a.series.elevation, length),
      place(b.series.t, b.series.elevation, length),
    ] as uPlot.AlignedData,
    flow: [
      times.map((t) => t / 3600),
      place(longer.series.t, longer.series.inflow, flow),
      place(a.series.t, a.series.outflow, flow),
      place(b.series.t, b.series.outflow, flow),
    ] as uPlot.AlignedData,
    levelRange: [
      length(Math.min(lo, Math.floor(Math.min(...peaks) - 0.5))),
      length(Math.max(hi, Math.ceil(Math.max(...peaks) + 0.5))),
    ],
  };
}

/** The thresholds and the dam crest as lines on the pool chart (display units). */
export function whatIfLines(definition: ReservoirDefinition, system: UnitSystem): ChartLine[] {
  return levelMarks(definition).map((mark) => ({
    id: mark.id,
    value: toDisplay(mark.elevation, 'length', system).value,
    label: mark.label,
    crest: mark.kind === 'dam-crest',
    color: mark.kind === 'dam-crest' ? dataInk.crest : dataInk.reference,
  }));
}

/** Schedule A solid in the pool's ink, B dashed in the accent: told apart without colour too. */
export const SIDE_STYLE: Record<'a' | 'b', { stroke: string; dash: number[] | undefined }> = {
  a: { stroke: dataInk.level, dash: undefined },
  b: { stroke: accent, dash: [9, 5] },
};

export interface ResultChartInput {
  kind: 'elevation' | 'flow';
  width: number;
  height: number;
  labelA: string;
  labelB: string;
  unit: string;
  lines: readonly ChartLine[];
  levelRange: [number, number];
}

const AXIS_FONT = `12px ${fonts.mono}`;
const LABEL_FONT = `13px ${fonts.sans}`;

const hoursText = (h: number) => {
  const minutes = Math.round(h * 60);
  return `+${Math.floor(minutes / 60)}:${String(minutes % 60).padStart(2, '0')} h`;
};

/**
 * uPlot options for one of the result charts: the pools of A and B against the thresholds and the
 * crest, or the inflow with both releases. x is hours from the start of the run.
 */
export function resultChartOptions(input: ResultChartInput): uPlot.Options {
  const { kind, width, height, labelA, labelB, unit, lines, levelRange: range } = input;
  const axis = {
    stroke: ink.secondary,
    font: AXIS_FONT,
    labelFont: LABEL_FONT,
    grid: { stroke: surface.line, width: 1 },
    ticks: { stroke: surface.line, width: 1 },
  };
  const value = (decimals: number) => (_u: uPlot, v: number | null) =>
    v == null ? '—' : v.toFixed(decimals);
  const x: uPlot.Series = {
    label: 'From start',
    value: (_u, v) => (v == null ? '—' : hoursText(v)),
  };
  const series: uPlot.Series[] =
    kind === 'elevation'
      ? [
          x,
          {
            label: `${labelA} (${unit})`,
            scale: 'y',
            width: 2.25,
            value: value(2),
            ...SIDE_STYLE.a,
          },
          {
            label: `${labelB} (${unit})`,
            scale: 'y',
            width: 2.25,
            value: value(2),
            ...SIDE_STYLE.b,
          },
        ]
      : [
          x,
          {
            label: `Inflow (${unit})`,
            scale: 'y',
            stroke: dataInk.flow,
            width: 1.5,
            dash: [2, 4],
            value: value(0),
          },
          {
            label: `Release ${labelA} (${unit})`,
            scale: 'y',
            width: 2,
            value: value(0),
            ...SIDE_STYLE.a,
          },
          {
            label: `Release ${labelB} (${unit})`,
            scale: 'y',
            width: 2,
            value: value(0),
            ...SIDE_STYLE.b,
          },
        ];
  return {
    width,
    height,
    cursor: { drag: { x: false, y: false }, sync: { key: 'what-if' } },
    legend: { live: true },
    scales: {
      x: { time: false },
      y:
        kind === 'elevation'
          ? {
              range: (_u, min, max) => [
                Number.isFinite(min) ? Math.min(range[0], min) : range[0],
                Number.isFinite(max) ? Math.max(range[1], max) : range[1],
              ],
            }
          : { range: (_u, _min, max) => [0, Number.isFinite(max) && max > 0 ? max * 1.1 : 1] },
    },
    series,
    axes: [
      {
        ...axis,
        label: 'Hours from the start',
        values: (_u, splits) => splits.map((s) => `${s}`),
        size: 44,
      },
      {
        ...axis,
        scale: 'y',
        label: kind === 'elevation' ? `Pool elevation (${unit})` : `Flow (${unit})`,
        size: 64,
      },
    ],
    hooks: kind === 'elevation' ? { draw: [(u: uPlot) => drawLines(u, lines, 'y')] } : undefined,
  };
}
