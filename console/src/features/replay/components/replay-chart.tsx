import { useEffect, useLayoutEffect, useRef } from 'react';
import Box from '@mui/material/Box';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { formatAxisTime, formatSiteTime } from '../../../lib/format';
import { dataInk, fonts, ink, signal, surface } from '../../../theme';
import type { ChartSeriesSpec } from '../utils/chart-data';

export interface ReplayChartProps {
  specs: readonly ChartSeriesSpec[];
  data: uPlot.AlignedData;
  fromMs: number;
  toMs: number;
  cursorMs: number;
  timeZone: string;
  units: { level: string; flow: string; opening: string };
  onSeek: (ms: number) => void;
  height?: number;
}

const OBSERVED_INK: Record<ChartSeriesSpec['scale'], string[]> = {
  level: [dataInk.level, '#b9c3cc'],
  flow: [dataInk.flow, '#c0a27d', '#8fb9a0'],
  opening: ['#a593c2', '#8fa8c9', '#c293b3'],
};

function seriesOptions(specs: readonly ChartSeriesSpec[], timeZone: string): uPlot.Series[] {
  const used = { level: 0, flow: 0, opening: 0 };
  return [
    {
      label: 'Site time',
      value: (_u, v) => (v == null ? '—' : `${formatSiteTime(v * 1000, timeZone).time}`),
    },
    ...specs.map((s): uPlot.Series => {
      const fmt = (_u: uPlot, v: number | null) => (v == null ? '—' : v.toFixed(2));
      if (s.kind !== 'observed')
        return {
          label: s.label,
          scale: 'level',
          stroke: s.kind === 'band-mid' ? dataInk.level : dataInk.band,
          width: s.kind === 'band-mid' ? 1.5 : 1,
          dash: s.kind === 'band-mid' ? [8, 5] : undefined,
          spanGaps: true,
          value: fmt,
        };
      const palette = OBSERVED_INK[s.scale];
      const stroke = palette[used[s.scale]++ % palette.length];
      return {
        label: s.label,
        scale: s.scale,
        stroke,
        width: s.scale === 'level' ? 2 : 1.5,
        spanGaps: true,
        value: fmt,
      };
    }),
  ];
}

/**
 * The replay chart: pool (left axis), flows (right), gate openings (own scale), and the forecast
 * band as it stood at the cursor. The cursor is a vertical line drawn on every redraw; a click
 * on the plot moves the replay there.
 */
export function ReplayChart(props: ReplayChartProps) {
  const { specs, data, fromMs, toMs, cursorMs, timeZone, units, onSeek, height = 340 } = props;
  const containerRef = useRef<HTMLDivElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const latest = useRef({ data, cursorMs, fromMs, toMs, onSeek });
  const shape = specs.map((s) => `${s.key}:${s.kind}`).join('|');

  // the draw hook and the click handler read the latest props through this
  useLayoutEffect(() => {
    latest.current = { data, cursorMs, fromMs, toMs, onSeek };
  });

  useLayoutEffect(() => {
    plotRef.current?.setData(data);
  }, [data]);

  useLayoutEffect(() => {
    plotRef.current?.redraw(false);
  }, [cursorMs]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return undefined;
    const axis = {
      stroke: ink.secondary,
      font: `12px ${fonts.mono}`,
      labelFont: `13px ${fonts.sans}`,
      grid: { stroke: surface.line, width: 1 },
      ticks: { stroke: surface.line, width: 1 },
    };
    const lowIdx = specs.findIndex((s) => s.kind === 'band-low') + 1;
    const highIdx = specs.findIndex((s) => s.kind === 'band-high') + 1;
    const opts: uPlot.Options = {
      width: Math.max(320, Math.floor(container.clientWidth)),
      height,
      tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), timeZone),
      cursor: { drag: { x: false, y: false } },
      // the values at the replay's moment are in the panel beside; a hover legend of dashes misleads
      legend: { live: false },
      scales: {
        x: { time: true, range: () => [latest.current.fromMs / 1000, latest.current.toMs / 1000] },
        flow: { range: (_u, _min, max) => [0, Number.isFinite(max) && max > 0 ? max * 1.3 : 1] },
        opening: {
          range: (_u, _min, max) => [0, Math.max(1, (Number.isFinite(max) ? max : 1) * 3)],
        },
      },
      series: seriesOptions(specs, timeZone),
      bands:
        lowIdx > 0 && highIdx > 0 ? [{ series: [highIdx, lowIdx], fill: dataInk.bandFill }] : [],
      axes: [
        {
          ...axis,
          size: 44,
          values: (_u, splits) => {
            let previous = '';
            return splits.map((s) => {
              const { time, day } = formatAxisTime(s * 1000, timeZone);
              const label = day === previous ? time : `${time}\n${day}`;
              previous = day;
              return label;
            });
          },
        },
        { ...axis, scale: 'level', label: `Pool elevation (${units.level})`, size: 64 },
        {
          ...axis,
          scale: 'flow',
          side: 1,
          label: `Flow (${units.flow})`,
          size: 64,
          grid: { show: false },
        },
        { scale: 'opening', show: false },
      ],
      hooks: {
        draw: [
          (u) => {
            const x = Math.round(u.valToPos(latest.current.cursorMs / 1000, 'x', true));
            const { ctx, bbox } = u;
            ctx.save();
            ctx.strokeStyle = signal.caution;
            ctx.lineWidth = 2 * uPlot.pxRatio;
            ctx.beginPath();
            ctx.moveTo(x, bbox.top);
            ctx.lineTo(x, bbox.top + bbox.height);
            ctx.stroke();
            ctx.restore();
          },
        ],
      },
    };
    const plot = new uPlot(opts, latest.current.data, container);
    plotRef.current = plot;
    const onClick = (e: MouseEvent) => {
      const rect = plot.over.getBoundingClientRect();
      latest.current.onSeek(plot.posToVal(e.clientX - rect.left, 'x') * 1000);
    };
    plot.over.addEventListener('click', onClick);
    const observer = new ResizeObserver((entries) => {
      const width = entries[0]?.contentRect.width;
      if (width && width > 0) plot.setSize({ width: Math.floor(width), height });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      plot.over.removeEventListener('click', onClick);
      plot.destroy();
      plotRef.current = null;
    };
    // rebuilt only when the set of series, the zone, the units or the height change
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [shape, timeZone, units.level, units.flow, units.opening, height]);

  return (
    <Box
      ref={containerRef}
      role="img"
      aria-label="Pool elevation, flows and gate openings over the replayed window, with the forecast band as it stood at the replay time"
      data-testid="replay-chart"
      data-cursor-ms={Math.round(cursorMs)}
      sx={{ width: '100%', minHeight: height, cursor: 'crosshair' }}
    />
  );
}
