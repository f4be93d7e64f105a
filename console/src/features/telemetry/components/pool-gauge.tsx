import Box from '@mui/material/Box';
import type { Quality } from '@stillwell/shared/telemetry';
import { severityColor } from '../../../components/ui/tone';
import { dataInk, fonts, ink, signal, surface } from '../../../theme';
import type { GaugeModel } from '../utils/gauge-model';
import { spreadLabels } from '../utils/gauge-model';

export interface PoolGaugeProps {
  model: GaugeModel;
  stale: boolean;
  quality: Quality | null;
}

const W = 340;
const H = 470;
const TOP = 18;
const BOTTOM = H - 18;
const COL_L = 62;
const COL_R = 122;
const LINE_R = 136;
const LABEL_X = 144;
const LABEL_GAP = 30;

/**
 * A vertical pool scale: the water column against every threshold and the dam crest. Greys while
 * normal; an exceeded threshold takes its signal colour; doubtful data is drawn as doubtful.
 */
export function PoolGauge({ model, stale, quality }: PoolGaugeProps) {
  const [lo, hi] = model.range;
  const y = (v: number) => TOP + ((hi - v) / (hi - lo || 1)) * (BOTTOM - TOP);
  const topFirst = [...model.marks].reverse();
  const labelYs = spreadLabels(
    topFirst.map((m) => y(m.value)),
    LABEL_GAP,
    TOP + 4,
    BOTTOM - LABEL_GAP + 14,
  );
  const doubtful = stale || quality !== 'good';
  const poolY = model.pool ? y(Math.max(lo, Math.min(hi, model.pool.value))) : null;
  const summary = [
    model.pool ? `Pool ${model.pool.text} ${model.unitText}` : 'Pool unknown',
    ...model.marks.map((m) => `${m.label} ${m.text} ${model.unitText}`),
  ].join('; ');

  return (
    <Box
      component="svg"
      viewBox={`0 0 ${W} ${H}`}
      role="img"
      aria-label={summary}
      sx={{ width: '100%', maxWidth: W, display: 'block', mx: 'auto' }}
    >
      <rect x={COL_L} y={TOP} width={COL_R - COL_L} height={BOTTOM - TOP} fill={surface.raised} />
      {model.ticks.map((tick, i) => (
        <g key={tick}>
          <line x1={COL_L - 7} x2={COL_L} y1={y(tick)} y2={y(tick)} stroke={ink.muted} />
          <text
            x={COL_L - 10}
            y={y(tick) + 4}
            textAnchor="end"
            fontSize={12}
            fontFamily={fonts.mono}
            fill={ink.secondary}
          >
            {model.tickTexts[i]}
          </text>
        </g>
      ))}
      <text x={COL_L - 10} y={TOP - 6} textAnchor="end" fontSize={11} fill={ink.muted}>
        {model.unitText}
      </text>

      {poolY !== null && quality !== 'bad' && (
        <rect
          x={COL_L}
          y={poolY}
          width={COL_R - COL_L}
          height={BOTTOM - poolY}
          fill={dataInk.water}
          opacity={doubtful ? 0.45 : 1}
        />
      )}
      <rect
        x={COL_L}
        y={TOP}
        width={COL_R - COL_L}
        height={BOTTOM - TOP}
        fill="none"
        stroke={surface.line}
      />

      {topFirst.map((mark, i) => {
        const lineY = y(mark.value);
        const labelY = labelYs[i] ?? lineY;
        const color = mark.exceeded ? severityColor(mark.severity) : ink.secondary;
        const stroke = mark.exceeded ? color : mark.crest ? dataInk.crest : dataInk.reference;
        return (
          <g key={mark.id} data-mark={mark.id} data-exceeded={mark.exceeded}>
            <line
              x1={COL_L}
              x2={LINE_R}
              y1={lineY}
              y2={lineY}
              stroke={stroke}
              strokeWidth={mark.crest ? 3 : 1.5}
              strokeDasharray={mark.crest ? undefined : '5 4'}
            />
            <line x1={LINE_R} x2={LABEL_X - 3} y1={lineY} y2={labelY - 4} stroke={stroke} />
            <text x={LABEL_X} y={labelY - 6} fontSize={12} fill={color}>
              {mark.label}
            </text>
            <text x={LABEL_X} y={labelY + 9} fontSize={12} fontFamily={fonts.mono} fill={color}>
              {mark.text} {model.unitText}
            </text>
          </g>
        );
      })}

      {poolY !== null && model.pool && (
        <g data-mark="pool">
          <line
            x1={COL_L}
            x2={COL_R}
            y1={poolY}
            y2={poolY}
            stroke={doubtful ? signal.doubt : dataInk.waterSurface}
            strokeWidth={2.5}
            strokeDasharray={quality === 'bad' ? '3 3' : undefined}
          />
          <polygon
            points={`${COL_L - 1},${poolY} ${COL_L - 9},${poolY - 6} ${COL_L - 9},${poolY + 6}`}
            fill={doubtful ? signal.doubt : dataInk.waterSurface}
          />
          <text
            x={(COL_L + COL_R) / 2}
            y={poolY - 6}
            textAnchor="middle"
            fontSize={12}
            fontFamily={fonts.mono}
            fill={doubtful ? signal.doubt : ink.primary}
            textDecoration={quality === 'bad' ? 'line-through' : undefined}
          >
            {model.pool.text}
          </text>
        </g>
      )}
    </Box>
  );
}
