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
import { toAlignedData } from '../utils/chart-data';
import { levelMarks, levelRange, severityOfKind } from '../utils/thresholds';
import type { ChartFrame } from './chart-options';
import { LevelInflowChart } from './level-inflow-chart';

export interface LevelInflowPanelProps {
  definition: ReservoirDefinition;
  status: ReservoirStatus;
  system: UnitSystem;
}

/** Pool elevation and inflow over the last hours of site time, against the thresholds. */
export function LevelInflowPanel({ definition, status, system }: LevelInflowPanelProps) {
  // The gauge the pool number comes from, so that chart and number agree.
  const poolChannel = status.pool?.source ?? definition.poolChannels[0] ?? null;
  const inflowChannel = definition.channels.find((c) => c.role === 'inflow')?.id ?? null;
  const pool = useChannelReadings(definition.id, poolChannel, CHART_WINDOW_MS);
  const inflow = useChannelReadings(definition.id, inflowChannel, CHART_WINDOW_MS);

  const data = useMemo(
    () =>
      toAlignedData([
        { series: pool.data, toDisplay: (v) => toDisplay(v, 'length', system).value },
        { series: inflow.data, toDisplay: (v) => toDisplay(v, 'flow', system).value },
      ]),
    [pool.data, inflow.data, system],
  );

  const elevation = status.pool?.elevation ?? null;
  const now = status.clock.now;
  const frame = useMemo<ChartFrame>(() => {
    const [lo, hi] = levelRange(definition, elevation);
    const shown = (si: number) => toDisplay(si, 'length', system).value;
    return {
      windowEndS: now / 1000,
      windowS: CHART_WINDOW_MS / 1000,
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
  }, [definition, elevation, now, system]);

  const levelUnit = formatQuantity(0, 'length', system).unitText;
  const flowUnit = formatQuantity(0, 'flow', system).unitText;
  const failed = pool.error ?? inflow.error;

  return (
    <Panel title={`Pool and inflow · last ${CHART_WINDOW_HOURS} h, site time`}>
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
        description={`Pool elevation in ${levelUnit} and inflow in ${flowUnit} over the last ${CHART_WINDOW_HOURS} hours, with the thresholds and the dam crest.`}
      />
    </Panel>
  );
}
