import { useCallback, useMemo } from 'react';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { CompareResponse } from '@stillwell/shared/forecasts';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { UnitSystem } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { formatQuantity } from '../../../lib/format';
import { resultChartOptions, whatIfChartData, whatIfLines } from '../utils/what-if-chart';
import { siteClockText } from '../utils/format-time';
import { WhatIfChart } from './what-if-chart';
import { WhatIfComparison } from './what-if-comparison';

export interface WhatIfResultsProps {
  result: CompareResponse;
  definition: ReservoirDefinition;
  system: UnitSystem;
  /** the form has changed since this result was routed */
  outdated: boolean;
}

const POOL_HEIGHT = 300;
const FLOW_HEIGHT = 220;

/** The routed pools and releases of both schedules, and the side-by-side table. */
export function WhatIfResults({ result, definition, system, outdated }: WhatIfResultsProps) {
  const data = useMemo(
    () => whatIfChartData(result, definition, system),
    [result, definition, system],
  );
  const lines = useMemo(() => whatIfLines(definition, system), [definition, system]);
  const levelUnit = formatQuantity(0, 'length', system).unitText;
  const flowUnit = formatQuantity(0, 'flow', system).unitText;
  const labelA = result.a.label;
  const labelB = result.b.label;
  const [lo, hi] = data.levelRange;
  const poolOptions = useCallback(
    (width: number) =>
      resultChartOptions({
        kind: 'elevation',
        width,
        height: POOL_HEIGHT,
        labelA,
        labelB,
        unit: levelUnit,
        lines,
        levelRange: [lo, hi],
      }),
    [labelA, labelB, levelUnit, lines, lo, hi],
  );
  const flowOptions = useCallback(
    (width: number) =>
      resultChartOptions({
        kind: 'flow',
        width,
        height: FLOW_HEIGHT,
        labelA,
        labelB,
        unit: flowUnit,
        lines: [],
        levelRange: [0, 1],
      }),
    [labelA, labelB, flowUnit],
  );
  const hours = Math.round(result.durationS / 360) / 10;

  return (
    <Box
      sx={{
        display: 'grid',
        gap: 2,
        gridTemplateColumns: { xs: '1fr', xl: 'minmax(0, 3fr) minmax(420px, 2fr)' },
        alignItems: 'start',
      }}
      data-testid="what-if-results"
      data-outdated={outdated}
    >
      <Panel
        title={`Routed pool and release · ${hours} h from ${siteClockText(result.startMs, definition.timeZone)}`}
      >
        {outdated && (
          <Typography variant="body2" sx={{ color: 'signal.caution', mb: 1 }} role="status">
            The tables have changed since this run: run again to see their effect.
          </Typography>
        )}
        <WhatIfChart
          data={data.elevation}
          options={poolOptions}
          height={POOL_HEIGHT}
          testId="what-if-pool-chart"
          description={`Pool elevation in ${levelUnit} under ${labelA} (solid) and ${labelB} (dashed), against the thresholds and the dam crest, over ${hours} hours.`}
        />
        <Box sx={{ mt: 1 }}>
          <WhatIfChart
            data={data.flow}
            options={flowOptions}
            height={FLOW_HEIGHT}
            testId="what-if-flow-chart"
            description={`Inflow (dotted) and the release in ${flowUnit} under ${labelA} (solid) and ${labelB} (dashed).`}
          />
        </Box>
        <Typography variant="body2" component="ul" sx={{ color: 'text.secondary', pl: 2, mb: 0 }}>
          {result.notes.map((note) => (
            <li key={note}>{note.charAt(0).toUpperCase() + note.slice(1)}.</li>
          ))}
          <li>
            Start: pool {formatQuantity(result.startElevation, 'length', system).text} {levelUnit},
            openings{' '}
            {Object.entries(result.initialOpenings)
              .map(([id, v]) => `${id} ${v}`)
              .join(', ') || 'all closed'}
            ; routing step {result.dtS} s; reservoir definition v{result.definitionVersion}.
          </li>
        </Typography>
      </Panel>
      <WhatIfComparison result={result} system={system} timeZone={definition.timeZone} />
    </Box>
  );
}
