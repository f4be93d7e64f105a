import { formatAxisTime } from '../../../lib/format';
import { ink, signal } from '../../../theme';
import { linearScale } from '../utils/scales';

export interface TimeLine {
  name: string;
  t: readonly number[];
  v: ReadonlyArray<number | null>;
  color: string;
  dash?: string;
}

export interface TimePlotProps {
  label: string;
  yLabel: string;
  lines: readonly TimeLine[];
  /** a fixed limit across the plot */
  limit: number | null;
  fromMs: number;
  toMs: number;
  timeZone: string;
  formatY: (v: number) => string;
}

const W = 520;
const H = 240;
const M = { left: 56, right: 12, top: 12, bottom: 36 };

/** Readings over time with their baseline and limits; a gap in the record is a gap in the line. */
export function TimePlot(p: TimePlotProps) {
  const ys = p.lines.flatMap((l) => l.v.filter((v): v is number => v !== null));
  const x = linearScale([p.fromMs, p.toMs], [M.left, W - M.right], 4);
  const y = linearScale(p.limit === null ? ys : [...ys, p.limit], [H - M.bottom, M.top]);
  const xTicks = Array.from({ length: 5 }, (_, i) => p.fromMs + ((p.toMs - p.fromMs) * i) / 4);
  const path = (l: TimeLine) => {
    let d = '';
    let pen = false;
    l.t.forEach((t, i) => {
      const v = l.v[i];
      if (v === null || v === undefined || t < p.fromMs) {
        pen = false;
        return;
      }
      d += `${pen ? 'L' : 'M'}${x(t).toFixed(1)},${y(v).toFixed(1)}`;
      pen = true;
    });
    return d;
  };
  return (
    <svg
      role="img"
      aria-label={p.label}
      viewBox={`0 0 ${W} ${H}`}
      width="100%"
      style={{ maxWidth: W }}
    >
      {y.ticks.map((t) => (
        <g key={t}>
          <line
            x1={M.left}
            x2={W - M.right}
            y1={y(t)}
            y2={y(t)}
            stroke={ink.muted}
            strokeOpacity={0.25}
          />
          <text x={M.left - 4} y={y(t) + 3} fill={ink.secondary} fontSize={10} textAnchor="end">
            {p.formatY(t)}
          </text>
        </g>
      ))}
      {xTicks.map((t) => {
        const label = formatAxisTime(t, p.timeZone);
        return (
          <text
            key={t}
            x={x(t)}
            y={H - M.bottom + 14}
            fill={ink.secondary}
            fontSize={10}
            textAnchor="middle"
          >
            {label.time}
            <tspan x={x(t)} dy={12}>
              {label.day}
            </tspan>
          </text>
        );
      })}
      <text
        x={12}
        y={(M.top + H - M.bottom) / 2}
        fill={ink.secondary}
        fontSize={11}
        textAnchor="middle"
        transform={`rotate(-90 12 ${(M.top + H - M.bottom) / 2})`}
      >
        {p.yLabel}
      </text>
      {p.lines.map((l) => (
        <path
          key={l.name}
          data-testid={`line-${l.name}`}
          d={path(l)}
          fill="none"
          stroke={l.color}
          strokeWidth={1.4}
          strokeDasharray={l.dash}
        />
      ))}
      {p.limit !== null && (
        <line
          data-testid="time-limit"
          x1={M.left}
          x2={W - M.right}
          y1={y(p.limit)}
          y2={y(p.limit)}
          stroke={signal.alarm}
          strokeWidth={1.2}
        />
      )}
      <text x={M.left + 4} y={M.top + 10} fill={ink.secondary} fontSize={10}>
        {p.lines.map((l) => l.name).join(' · ')}
        {p.limit !== null && ' · limit'}
      </text>
    </svg>
  );
}
