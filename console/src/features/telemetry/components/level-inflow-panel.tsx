import { useMemo } from 'react';
import Typography from '@mui/material/Typography';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ReservoirStatus } from '@stillwell/shared/telemetry';
import { toDisplay, type UnitSystem } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { severityColor } from '../../../components/ui/tone';
import { CHART_WINDOW_HOURS, CHART_WINDOW_MS } from '../../../config/display';
import { describeError } from '../../../lib/api-client';
import { formatQuantity } from '../../../lib/format';
import { dataInk } from '../../../theme';
import { useChannelReadings } from '../api/get-channel-readings';
import { toAlignedData, withForecast } from '../utils/chart-data';
import { levelMarks, levelRange, severityOfKind } from '../utils/thresholds';
import type { ChartForecast, ChartFrame } from './chart-options';
import { LevelInflowChart } from './level-inflow-chart';

export interface LevelInflowPanelProps {
  definition: ReservoirDefinition;
  status: ReservoirStatus;
  system: UnitSystem;
  /** the forecast to draw ahead of now, in display units (null or absent: none) */
  forecast?: ChartForecast | null;
}

/** Pool elevation and inflow over the last hours of site time, against the thresholds. */
export function LevelInflowPanel({
  definition,
  status,
  system,
  forecast = null,
}: LevelInflowPanelProps) {
  // The gauge the pool number comes from, so that chart and number agree.
  const poolChannel = status.pool?.source ?? definition.poolChannels[0] ?? null;
  const inflowChannel = definition.channels.find((c) => c.role === 'inflow')?.id ?? null;
  const pool = useChannelReadings(definition.id, poolChannel, CHART_WINDOW_MS);
  const inflow = useChannelReadings(definition.id, inflowChannel, CHART_WINDOW_MS);

  const data = useMemo(
    () =>
      withForecast(
        toAlignedData([
          { series: pool.data, toDisplay: (v) => toDisplay(v, 'length', system).value },
          { series: inflow.data, toDisplay: (v) => toDisplay(v, 'flow', system).value },
        ]),
        forecast,
      ),
    [pool.data, inflow.data, system, forecast],
  );
  const aheadS = forecast?.aheadS ?? 0;

  const elevation = status.pool?.elevation ?? null;
  const now = status.clock.now;
  const frame = useMemo<ChartFrame>(() => {
    const [lo, hi] = levelRange(definition, elevation);
    const shown = (si: number) => toDisplay(si, 'length', system).value;
    return {
      windowEndS: now / 1000,
      windowS: CHART_WINDOW_MS / 1000,
      aheadS,
      levelRange: [shown(lo), shown(hi)],
      lines: levelMarks(definition).map((mark) => {
        const exceeded = elevation !== null && elevation > mark.elevation;
        const crest = mark.kind === 'dam-crest';
        return {
          id: mark.id,
          value: shown(mark.elevation),
          label: mark.label,
          crest,
          color: exceeded
            ? severityColor(severityOfKind(mark.kind))
            : crest
              ? dataInk.crest
              : dataInk.reference,
        };
      }),
    };
  }, [definition, elevation, now, system, aheadS]);

  const levelUnit = formatQuantity(0, 'length', system).unitText;
  const flowUnit = formatQuantity(0, 'flow', system).unitText;
  const failed = pool.error ?? inflow.error;

  return (
    <Panel
      title={`Pool and inflow · last ${CHART_WINDOW_HOURS} h${aheadS ? ` and forecast ${Math.round(aheadS / 3600)} h ahead` : ''}, site time`}
    >
      {failed && (
        <Typography role="alert" sx={{ color: 'signal.alarm', mb: 1 }}>
          Readings could not be loaded: {describeError(failed)}
        </Typography>
      )}
      <LevelInflowChart
        data={data}
        frame={frame}
        timeZone={definition.timeZone}
        levelUnit={levelUnit}
        flowUnit={flowUnit}
        description={`Pool elevation in ${levelUnit} and inflow in ${flowUnit} over the last ${CHART_WINDOW_HOURS} hours, with the thresholds and the dam crest${aheadS ? `, and the forecast band (p10 to p90) with its median for the next ${Math.round(aheadS / 3600)} hours` : ''}.`}
      />
    </Panel>
  );
}
