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

/** What moves between draws without rebuilding the chart. */
export interface ChartFrame {
  /** the site's now, s: the window's right edge */
  windowEndS: number;
  windowS: number;
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

function drawLines(u: uPlot, lines: readonly ChartLine[]) {
  const { ctx, bbox } = u;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.font = `${Math.round(11 * px)}px ${fonts.sans}`;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'bottom';
  for (const line of lines) {
    const y = Math.round(u.valToPos(line.value, 'level', true));
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
 * Series are x, observed pool, observed inflow. The forecast band (a later issue) joins after
 * them as a pair of level series filled between with `bands`, and the x range then reaches past
 * the site's now.
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
          const { windowEndS, windowS } = frame();
          return [windowEndS - windowS, windowEndS];
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
    ],
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
      draw: [(u) => drawLines(u, frame().lines)],
    },
  };
}
