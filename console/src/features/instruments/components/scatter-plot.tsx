import { dataInk, ink, signal } from '../../../theme';
import { linearScale, recency } from '../utils/scales';

export interface ScatterPoint {
  x: number;
  y: number;
  t: number;
}

export interface ScatterPlotProps {
  label: string;
  xLabel: string;
  yLabel: string;
  points: readonly ScatterPoint[];
  /** the baseline against x */
  curve: ReadonlyArray<{ x: number; y: number }>;
  /** the alarm limit (a level of y) */
  limit: number | null;
  fromMs: number;
  toMs: number;
  /** older and newer ends of the shading, for the legend */
  legend: { older: string; newer: string };
  formatX: (v: number) => string;
  formatY: (v: number) => string;
}

const W = 520;
const H = 300;
const M = { left: 56, right: 12, top: 12, bottom: 40 };

/**
 * A reading against the pool, each point shaded by its date (faint and grey when old, bright
 * when new), over the baseline and under the limit: a change of behaviour is a cloud of bright
 * points away from the faint one at the same pool level.
 */
export function ScatterPlot(p: ScatterPlotProps) {
  const xs = [...p.points.map((q) => q.x), ...p.curve.map((c) => c.x)];
  const ys = [
    ...p.points.map((q) => q.y),
    ...p.curve.map((c) => c.y),
    ...(p.limit === null ? [] : [p.limit]),
  ];
  const x = linearScale(xs, [M.left, W - M.right]);
  const y = linearScale(ys, [H - M.bottom, M.top]);
  const curve = p.curve.map((c) => `${x(c.x).toFixed(1)},${y(c.y).toFixed(1)}`).join(' ');
  return (
    <svg
      role="img"
      aria-label={p.label}
      viewBox={`0 0 ${W} ${H}`}
      width="100%"
      style={{ maxWidth: W }}
    >
      {x.ticks.map((t) => (
        <g key={`x${t}`}>
          <line
            x1={x(t)}
            x2={x(t)}
            y1={M.top}
            y2={H - M.bottom}
            stroke={ink.muted}
            strokeOpacity={0.25}
          />
          <text
            x={x(t)}
            y={H - M.bottom + 14}
            fill={ink.secondary}
            fontSize={10}
            textAnchor="middle"
          >
            {p.formatX(t)}
          </text>
        </g>
      ))}
      {y.ticks.map((t) => (
        <g key={`y${t}`}>
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
      <text
        x={(M.left + W - M.right) / 2}
        y={H - 4}
        fill={ink.secondary}
        fontSize={11}
        textAnchor="middle"
      >
        {p.xLabel}
      </text>
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
      {p.points.map((q, i) => {
        const r = recency(q.t, p.fromMs, p.toMs);
        return (
          <circle
            key={i}
            data-testid="scatter-point"
            data-recency={r.toFixed(2)}
            cx={x(q.x)}
            cy={y(q.y)}
            r={2.2}
            fill={r > 0.9 ? dataInk.level : dataInk.flow}
            fillOpacity={0.12 + 0.88 * r}
          />
        );
      })}
      <polyline
        data-testid="scatter-baseline"
        points={curve}
        fill="none"
        stroke={dataInk.crest}
        strokeWidth={1.5}
        strokeDasharray="6 3"
      />
      {p.limit !== null && (
        <g data-testid="scatter-limit">
          <line
            x1={M.left}
            x2={W - M.right}
            y1={y(p.limit)}
            y2={y(p.limit)}
            stroke={signal.alarm}
            strokeWidth={1.2}
          />
          <text
            x={W - M.right - 2}
            y={y(p.limit) - 3}
            fill={signal.alarm}
            fontSize={10}
            textAnchor="end"
          >
            limit
          </text>
        </g>
      )}
      <text x={M.left + 4} y={M.top + 10} fill={ink.secondary} fontSize={10}>
        faint: {p.legend.older} · bright: {p.legend.newer} · dashed: baseline
      </text>
    </svg>
  );
}
