import uPlot from 'uplot';
import { formatAxisTime, formatSiteTime } from '../../../lib/format';
import { dataInk, fonts, ink, surface } from '../../../theme';

/** A horizontal reference line on the level axis: a threshold or the dam crest. */
export interface ChartLine {
  id: string;
  /** display units */
  value: number;
  label: string;
  color: string;
  crest: boolean;
}

/**
 * A forecast to draw ahead of now (display units, x in s): the band between low and high shaded,
 * the median dashed, the inflow forecast dotted. Made by the forecasts feature, drawn here.
 */
export interface ChartForecast {
  t: number[];
  low: number[];
  median: number[];
  high: number[];
  inflow: number[];
  /** how far past now the x axis reaches, s */
  aheadS: number;
}

/** Series order: x, pool, inflow, then the forecast's (empty columns when there is none). */
export const SERIES = {
  pool: 1,
  inflow: 2,
  low: 3,
  median: 4,
  high: 5,
  forecastInflow: 6,
} as const;
export const SERIES_COUNT = 7;

/** What moves between draws without rebuilding the chart. */
export interface ChartFrame {
  /** the site's now, s: the end of the observed window */
  windowEndS: number;
  windowS: number;
  /** how far the x axis reaches past now, for the forecast (s; default 0) */
  aheadS?: number;
  /** display units; the level axis shows at least this */
  levelRange: [number, number];
  lines: readonly ChartLine[];
}

export interface ChartOptionsInput {
  width: number;
  height: number;
  timeZone: string;
  levelUnit: string;
  flowUnit: string;
  /** read on every draw, so lines and window follow the latest props */
  frame: () => ChartFrame;
}

/** Tick labels in the site's zone, 24-hour; the day is added where it changes. */
function timeTicks(timeZone: string) {
  return (_u: uPlot, splits: number[]) => {
    let previousDay = '';
    return splits.map((s) => {
      const { time, day } = formatAxisTime(s * 1000, timeZone);
      const label = day === previousDay ? time : `${time}\n${day}`;
      previousDay = day;
      return label;
    });
  };
}

const AXIS_FONT = `12px ${fonts.mono}`;
const LABEL_FONT = `13px ${fonts.sans}`;

/** A vertical mark at the site's now when the chart shows a forecast beyond it. */
function drawNow(u: uPlot, frame: ChartFrame) {
  if (!frame.aheadS) return;
  const { ctx, bbox } = u;
  const px = uPlot.pxRatio;
  const x = Math.round(u.valToPos(frame.windowEndS, 'x', true));
  if (x < bbox.left || x > bbox.left + bbox.width) return;
  ctx.save();
  ctx.strokeStyle = dataInk.crest;
  ctx.lineWidth = px;
  ctx.setLineDash([2 * px, 3 * px]);
  ctx.beginPath();
  ctx.moveTo(x, bbox.top);
  ctx.lineTo(x, bbox.top + bbox.height);
  ctx.stroke();
  ctx.fillStyle = ink.secondary;
  ctx.font = `${Math.round(11 * px)}px ${fonts.sans}`;
  ctx.textAlign = 'left';
  ctx.textBaseline = 'top';
  ctx.fillText('now · forecast →', x + 4 * px, bbox.top + 2 * px);
  ctx.restore();
}

/**
 * The thresholds and the dam crest across the plot on the 'level' scale: dashed thresholds, the
 * crest solid and heavier, each labelled at the right end. Lines outside the scale are skipped.
 */
export function drawLines(u: uPlot, lines: readonly ChartLine[], scale = 'level') {
  const { ctx, bbox } = u;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.font = `${Math.round(11 * px)}px ${fonts.sans}`;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'bottom';
  for (const line of lines) {
    const y = Math.round(u.valToPos(line.value, scale, true));
    if (y < bbox.top || y > bbox.top + bbox.height) continue;
    ctx.strokeStyle = line.color;
    ctx.lineWidth = (line.crest ? 2.5 : 1) * px;
    ctx.setLineDash(line.crest ? [] : [6 * px, 5 * px]);
    ctx.beginPath();
    ctx.moveTo(bbox.left, y);
    ctx.lineTo(bbox.left + bbox.width, y);
    ctx.stroke();
    ctx.fillStyle = line.color;
    ctx.fillText(line.label, bbox.left + bbox.width - 4 * px, y - 2 * px);
  }
  ctx.restore();
}

/**
 * uPlot options for pool elevation (left axis) and inflow (right axis) over a site-time window.
 * Series are x, observed pool, observed inflow, then the forecast: the p10 and p90 of the pool
 * filled between with `bands`, the median, and the inflow forecast; the x range then reaches past
 * the site's now by the frame's aheadS.
 */
export function buildChartOptions(input: ChartOptionsInput): uPlot.Options {
  const { width, height, timeZone, levelUnit, flowUnit, frame } = input;
  const axis = {
    stroke: ink.secondary,
    font: AXIS_FONT,
    labelFont: LABEL_FONT,
    grid: { stroke: surface.line, width: 1 },
    ticks: { stroke: surface.line, width: 1 },
  };
  return {
    width,
    height,
    tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), timeZone),
    // The window is the site's, so zooming by drag would fight it.
    cursor: { drag: { x: false, y: false } },
    legend: { live: true },
    scales: {
      x: {
        time: true,
        range: () => {
          const { windowEndS, windowS, aheadS = 0 } = frame();
          return [windowEndS - windowS, windowEndS + aheadS];
        },
      },
      level: {
        range: (_u, min, max) => {
          const [lo, hi] = frame().levelRange;
          return [
            Number.isFinite(min) ? Math.min(lo, min) : lo,
            Number.isFinite(max) ? Math.max(hi, max) : hi,
          ];
        },
      },
      flow: {
        // Headroom keeps the inflow trace clear of the crest lines at the top.
        range: (_u, _min, max) => [0, Number.isFinite(max) && max > 0 ? max * 1.4 : 1],
      },
    },
    series: [
      {
        label: 'Site time',
        value: (_u, v) => {
          if (v == null) return '—';
          const shown = formatSiteTime(v * 1000, timeZone);
          return `${shown.time} ${shown.zone}`;
        },
      },
      {
        label: `Pool (${levelUnit})`,
        scale: 'level',
        stroke: dataInk.level,
        width: 2.5,
        value: (_u, v) => (v == null ? '—' : v.toFixed(2)),
      },
      {
        label: `Inflow (${flowUnit})`,
        scale: 'flow',
        stroke: dataInk.flow,
        width: 1.75,
        value: (_u, v) => (v == null ? '—' : v.toFixed(v < 100 ? 1 : 0)),
      },
      {
        label: 'Forecast p10',
        scale: 'level',
        stroke: dataInk.band,
        width: 1,
        value: (_u, v) => (v == null ? '—' : v.toFixed(2)),
      },
      {
        label: 'Forecast median',
        scale: 'level',
        stroke: dataInk.level,
        width: 1.5,
        dash: [8, 5],
        value: (_u, v) => (v == null ? '—' : v.toFixed(2)),
      },
      {
        label: 'Forecast p90',
        scale: 'level',
        stroke: dataInk.band,
        width: 1,
        value: (_u, v) => (v == null ? '—' : v.toFixed(2)),
      },
      {
        label: `Inflow forecast (${flowUnit})`,
        scale: 'flow',
        stroke: dataInk.flow,
        width: 1.25,
        dash: [2, 4],
        value: (_u, v) => (v == null ? '—' : v.toFixed(v < 100 ? 1 : 0)),
      },
    ],
    // p10 to p90 shaded: the spread of the ensemble, never one line presented as certain
    bands: [{ series: [SERIES.high, SERIES.low], fill: dataInk.bandFill }],
    axes: [
      { ...axis, values: timeTicks(timeZone), size: 44 },
      { ...axis, scale: 'level', label: `Pool elevation (${levelUnit})`, size: 64 },
      {
        ...axis,
        scale: 'flow',
        side: 1,
        label: `Inflow (${flowUnit})`,
        size: 64,
        grid: { show: false },
      },
    ],
    hooks: {
      draw: [
        (u) => {
          drawLines(u, frame().lines);
          drawNow(u, frame());
        },
      ],
    },
  };
}
