import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { PiezometerSeries, WeirSeries } from '@stillwell/shared/alarms';
import type { UnitSystem } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { formatNumber, formatSiteTime } from '../../../lib/format';
import { dataInk, ink, signal } from '../../../theme';
import { levelUnit, seepageText, seepageUnit, toLevel, toSeepage } from '../utils/units';
import { ScatterPlot, type ScatterPoint } from './scatter-plot';
import { TimePlot } from './time-plot';

interface Common {
  fromMs: number;
  toMs: number;
  timeZone: string;
  system: UnitSystem;
}

const day = (ms: number, tz: string) => formatSiteTime(ms, tz).date;

function pairs(
  t: readonly number[],
  xs: ReadonlyArray<number | null>,
  ys: readonly number[],
): ScatterPoint[] {
  return t.flatMap((tt, i) =>
    xs[i] === null || xs[i] === undefined ? [] : [{ x: xs[i]!, y: ys[i]!, t: tt }],
  );
}

export function WeirPanel({ s, fromMs, toMs, timeZone, system }: Common & { s: WeirSeries }) {
  const u = seepageUnit(system);
  const lu = levelUnit(system);
  const last = s.flow.length ? s.flow[s.flow.length - 1]! : null;
  const fmtQ = (v: number) => formatNumber(v, u.digits);
  const fmtZ = (v: number) => formatNumber(v, lu.digits);
  const q = (v: number) => toSeepage(v, system);
  const z = (v: number) => toLevel(v, system);
  return (
    <Panel
      title={`${s.weir.label} (${s.weir.abutment} abutment)`}
      aside={
        <Typography
          data-testid={`weir-latest-${s.weir.id}`}
          sx={{ color: last !== null && last > s.weir.maxFlow ? signal.alarm : ink.primary }}
        >
          {last === null ? 'no readings' : seepageText(last, system)}
        </Typography>
      }
    >
      <Box sx={{ display: 'grid', gap: 1, gridTemplateColumns: { xs: '1fr', xl: '1fr 1fr' } }}>
        <ScatterPlot
          label={`${s.weir.label}: seepage against pool elevation`}
          xLabel={`pool elevation (${lu.unit})`}
          yLabel={`seepage (${u.label})`}
          points={pairs(s.t, s.pool, s.flow).map((p) => ({ x: z(p.x), y: q(p.y), t: p.t }))}
          curve={s.curve.map((c) => ({ x: z(c.pool), y: q(c.flow) }))}
          limit={q(s.weir.maxFlow)}
          fromMs={fromMs}
          toMs={toMs}
          legend={{ older: day(fromMs, timeZone), newer: day(toMs, timeZone) }}
          formatX={fmtZ}
          formatY={fmtQ}
        />
        <TimePlot
          label={`${s.weir.label}: seepage over time`}
          yLabel={`seepage (${u.label})`}
          lines={[
            { name: 'seepage', t: s.t, v: s.flow.map(q), color: dataInk.level },
            {
              name: 'baseline',
              t: s.t,
              v: s.baseline.map((v) => (v === null ? null : q(v))),
              color: dataInk.crest,
              dash: '6 3',
            },
            {
              name: 'rising above baseline',
              t: s.t,
              v: s.limit.map((v) => (v === null ? null : q(v))),
              color: signal.caution,
              dash: '2 3',
            },
          ]}
          limit={q(s.weir.maxFlow)}
          fromMs={fromMs}
          toMs={toMs}
          timeZone={timeZone}
          formatY={fmtQ}
        />
      </Box>
      <Typography variant="body2" sx={{ color: 'text.secondary' }}>
        {s.weir.notchAngleDeg}° V-notch; flow from the head by the Kindsvater-Shen equation.
        Baseline {seepageText(s.weir.baseline.referenceFlow, system)} at{' '}
        {fmtZ(z(s.weir.baseline.referencePool))} {lu.unit}, following the pool with a{' '}
        {s.weir.baseline.lagHours} h lag; alarm above {seepageText(s.weir.maxFlow, system)}, or{' '}
        {formatNumber(s.weir.baseline.tolerance * 100, 0)} % +{' '}
        {seepageText(s.weir.baseline.toleranceFlow, system)} above the baseline.
      </Typography>
    </Panel>
  );
}

export function PiezometerPanel({
  s,
  fromMs,
  toMs,
  timeZone,
  system,
}: Common & { s: PiezometerSeries }) {
  const lu = levelUnit(system);
  const z = (v: number) => toLevel(v, system);
  const fmt = (v: number) => formatNumber(v, lu.digits);
  const last = s.level.length ? s.level[s.level.length - 1]! : null;
  return (
    <Panel
      title={`Piezometer ${s.piezometer.label}`}
      aside={
        <Typography
          data-testid={`piezometer-latest-${s.piezometer.id}`}
          sx={{ color: last !== null && last > s.piezometer.maxLevel ? signal.alarm : ink.primary }}
        >
          {last === null ? 'no readings' : `${fmt(z(last))} ${lu.unit}`}
        </Typography>
      }
    >
      <Box sx={{ display: 'grid', gap: 1, gridTemplateColumns: { xs: '1fr', xl: '1fr 1fr' } }}>
        <ScatterPlot
          label={`Piezometer ${s.piezometer.label}: level against pool elevation`}
          xLabel={`pool elevation (${lu.unit})`}
          yLabel={`piezometric level (${lu.unit})`}
          points={pairs(s.t, s.pool, s.level).map((p) => ({ x: z(p.x), y: z(p.y), t: p.t }))}
          curve={s.curve.map((c) => ({ x: z(c.pool), y: z(c.level) }))}
          limit={z(s.piezometer.maxLevel)}
          fromMs={fromMs}
          toMs={toMs}
          legend={{ older: day(fromMs, timeZone), newer: day(toMs, timeZone) }}
          formatX={fmt}
          formatY={fmt}
        />
        <TimePlot
          label={`Piezometer ${s.piezometer.label}: level over time`}
          yLabel={`level (${lu.unit})`}
          lines={[
            { name: 'level', t: s.t, v: s.level.map(z), color: dataInk.level },
            {
              name: 'baseline',
              t: s.t,
              v: s.baseline.map((v) => (v === null ? null : z(v))),
              color: dataInk.crest,
              dash: '6 3',
            },
          ]}
          limit={z(s.piezometer.maxLevel)}
          fromMs={fromMs}
          toMs={toMs}
          timeZone={timeZone}
          formatY={fmt}
        />
      </Box>
      <Typography variant="body2" sx={{ color: 'text.secondary' }}>
        {s.piezometer.location}. Baseline: {formatNumber(s.piezometer.baseline.ratio * 100, 0)} % of
        the head above {fmt(z(s.piezometer.baseline.downstreamLevel))} {lu.unit},{' '}
        {s.piezometer.baseline.lagHours} h lag; alarm above {fmt(z(s.piezometer.maxLevel))}{' '}
        {lu.unit}.
      </Typography>
    </Panel>
  );
}
