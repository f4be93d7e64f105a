import { useMemo } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ForecastRun } from '@stillwell/shared/forecasts';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { UnitSystem } from '@stillwell/shared/units';
import { useWhatIfForm } from '../hooks/use-what-if-form';
import { problemsOf } from '../utils/what-if-request';
import { scheduleControls } from '../utils/what-if-tables';
import { ForecastCaution } from './forecast-caution';
import { WhatIfHydrographEditor } from './what-if-hydrograph-editor';
import { WhatIfResults } from './what-if-results';
import { WhatIfScheduleEditor } from './what-if-schedule-editor';
import { WhatIfStartFields } from './what-if-start-fields';

export interface WhatIfScreenProps {
  definition: ReservoirDefinition;
  system: UnitSystem;
  /** the pool now, m (null: no usable reading) */
  currentPool: number | null;
  /** the latest live forecast, to start from its inflow */
  forecast: ForecastRun | null;
  /** may this person run a what-if (forecast.run)? the gateway decides; this only explains */
  canRun: boolean;
}

/**
 * What-if: an inflow hydrograph routed under two gate schedules, A and B, from the pool now (or a
 * given one), with the results side by side. Nothing is stored or commanded: it is a question.
 */
export function WhatIfScreen({
  definition,
  system,
  currentPool,
  forecast,
  canRun,
}: WhatIfScreenProps) {
  const form = useWhatIfForm(definition);
  const controls = useMemo(() => scheduleControls(definition), [definition]);
  const { values, update, problems } = form;
  const general = problemsOf(problems, 'general');

  return (
    <Box sx={{ display: 'grid', gap: 2 }} data-testid="what-if-screen">
      <Box>
        <Typography variant="h2" component="h1" sx={{ mb: 0.5 }}>
          What-if: two gate schedules on one flood
        </Typography>
        <Typography variant="body2" sx={{ color: 'text.secondary', mb: 0.5 }}>
          Routes the inflow below through {definition.name} under schedule A and schedule B, with
          the live forecast&apos;s engine. Nothing is stored and no gate moves.
        </Typography>
        <ForecastCaution />
      </Box>

      <Box
        sx={{
          display: 'grid',
          gap: 2,
          alignItems: 'start',
          gridTemplateColumns: { xs: '1fr', lg: 'minmax(0, 1fr) minmax(0, 1fr) minmax(0, 1fr)' },
        }}
      >
        <WhatIfHydrographEditor
          rows={values.hydrograph}
          onChange={(hydrograph) => update({ hydrograph })}
          problems={problemsOf(problems, 'inflow')}
          forecast={forecast}
          timeZone={definition.timeZone}
        />
        <WhatIfScheduleEditor
          side="a"
          draft={values.a}
          onChange={(a) => update({ a })}
          controls={controls}
          problems={problemsOf(problems, 'scheduleA')}
          nameProblems={problemsOf(problems, 'labelA')}
        />
        <WhatIfScheduleEditor
          side="b"
          draft={values.b}
          onChange={(b) => update({ b })}
          controls={controls}
          problems={problemsOf(problems, 'scheduleB')}
          nameProblems={problemsOf(problems, 'labelB')}
        />
      </Box>

      <Paper
        component="section"
        aria-label="Start and run"
        sx={{
          p: 2,
          display: 'grid',
          gap: 2,
          alignItems: 'start',
          gridTemplateColumns: { xs: '1fr', md: 'minmax(0, 1fr) auto' },
        }}
      >
        <WhatIfStartFields
          values={values}
          onChange={update}
          currentPool={currentPool}
          problems={{
            startElevation: problemsOf(problems, 'startElevation'),
            durationS: problemsOf(problems, 'durationS'),
          }}
        />
        <Box sx={{ display: 'grid', gap: 0.5, justifyItems: { md: 'end' } }}>
          <Button
            variant="contained"
            size="large"
            onClick={form.run}
            disabled={!canRun || form.running}
            startIcon={form.running ? <CircularProgress size={18} color="inherit" /> : undefined}
            data-testid="run-what-if"
          >
            Compare A and B
          </Button>
          {!canRun && (
            <Typography
              variant="body2"
              sx={{ color: 'text.secondary', maxWidth: 280 }}
              data-testid="run-not-allowed"
            >
              Running a what-if is for operators and engineers (forecast.run); your roles can read
              the forecasts only.
            </Typography>
          )}
        </Box>
      </Paper>

      {(general.length > 0 || form.failure) && (
        <Alert severity="error" variant="outlined" data-testid="what-if-error">
          {form.failure && <div>The comparison could not be run: {form.failure}</div>}
          {general.map((p) => (
            <div key={p.message}>{p.message}</div>
          ))}
        </Alert>
      )}

      {form.result && (
        <WhatIfResults
          result={form.result}
          definition={definition}
          system={system}
          outdated={form.outdated}
        />
      )}
      {form.result && <ForecastCaution text={form.result.caution} />}
    </Box>
  );
}
