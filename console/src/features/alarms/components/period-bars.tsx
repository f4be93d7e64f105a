import { ACCEPTABLE_PER_10_MIN, FLOOD_PER_10_MIN } from '@stillwell/shared/alarms';
import { dataInk, ink, signal } from '../../../theme';

export interface PeriodBarsProps {
  /** alarms per operator in consecutive 10-minute periods */
  periods: readonly number[];
  height?: number;
}

/** Alarms per 10 minutes as bars, against the acceptable rate and the flood line. */
export function PeriodBars({ periods, height = 140 }: PeriodBarsProps) {
  const width = 900;
  const top = Math.max(FLOOD_PER_10_MIN + 2, ...periods);
  const y = (v: number) => height - 16 - (v / top) * (height - 24);
  const w = width / Math.max(periods.length, 1);
  return (
    <svg
      role="img"
      aria-label="Alarms per 10 minutes"
      viewBox={`0 0 ${width} ${height}`}
      width="100%"
      style={{ maxHeight: height * 1.5 }}
    >
      {periods.map((n, i) =>
        n > 0 ? (
          <rect
            key={i}
            data-testid="period-bar"
            x={i * w}
            y={y(n)}
            width={Math.max(1, w - 0.5)}
            height={height - 16 - y(n)}
            fill={n >= FLOOD_PER_10_MIN ? signal.alarm : dataInk.flow}
          />
        ) : null,
      )}
      {[
        { v: ACCEPTABLE_PER_10_MIN, label: 'acceptable (1)', color: ink.secondary },
        { v: FLOOD_PER_10_MIN, label: 'flood (10)', color: signal.alarm },
      ].map((line) => (
        <g key={line.v}>
          <line
            x1={0}
            x2={width}
            y1={y(line.v)}
            y2={y(line.v)}
            stroke={line.color}
            strokeDasharray="4 4"
          />
          <text x={4} y={y(line.v) - 3} fill={line.color} fontSize={11}>
            {line.label}
          </text>
        </g>
      ))}
    </svg>
  );
}
