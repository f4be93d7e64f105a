import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import type { FormProblem, StartGates, WhatIfValues } from '../utils/what-if-request';

export interface WhatIfStartFieldsProps {
  values: Pick<WhatIfValues, 'startElevation' | 'durationH' | 'startGates'>;
  onChange: (patch: Partial<WhatIfValues>) => void;
  problems: { startElevation: readonly FormProblem[]; durationS: readonly FormProblem[] };
  /** the pool now, m, for the placeholder (null: no usable reading) */
  currentPool: number | null;
}

const joined = (ps: readonly FormProblem[]) => ps.map((p) => p.message).join('; ');

/** Where the run starts: the pool, the gates, and how long it runs. */
export function WhatIfStartFields({
  values,
  onChange,
  problems,
  currentPool,
}: WhatIfStartFieldsProps) {
  const poolError = joined(problems.startElevation);
  const durationError = joined(problems.durationS);
  return (
    <Box
      sx={{
        display: 'grid',
        gap: 1.5,
        gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, minmax(0, 1fr))' },
      }}
    >
      <TextField
        size="small"
        label="Start pool elevation (m)"
        value={values.startElevation}
        onChange={(e) => onChange({ startElevation: e.target.value })}
        placeholder={currentPool !== null ? `now ${currentPool.toFixed(2)}` : 'no pool reading'}
        error={poolError !== ''}
        helperText={
          poolError ||
          (currentPool !== null ? 'Empty: the pool now' : 'No pool reading now: give one')
        }
        slotProps={{
          inputLabel: { shrink: true },
          htmlInput: { inputMode: 'decimal', 'data-testid': 'start-elevation' },
        }}
      />
      <TextField
        select
        size="small"
        label="Gates and valves at the start"
        value={values.startGates}
        onChange={(e) => onChange({ startGates: e.target.value as StartGates })}
        helperText="Until a schedule row moves them"
        slotProps={{ htmlInput: { 'data-testid': 'start-gates' } }}
      >
        <MenuItem value="current">As reported now</MenuItem>
        <MenuItem value="closed">All closed</MenuItem>
      </TextField>
      <TextField
        size="small"
        label="Run length (h)"
        value={values.durationH}
        onChange={(e) => onChange({ durationH: e.target.value })}
        placeholder="the hydrograph, at least 24"
        error={durationError !== ''}
        helperText={durationError || 'Empty: the hydrograph’s length, at least 24 h'}
        slotProps={{
          inputLabel: { shrink: true },
          htmlInput: { inputMode: 'decimal', 'data-testid': 'duration-h' },
        }}
      />
    </Box>
  );
}
