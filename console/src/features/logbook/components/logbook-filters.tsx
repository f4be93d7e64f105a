import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import { LOGBOOK_KIND_FILTERS } from '@stillwell/shared/logbook';
import { controlsOf } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { LogbookFilter } from '../utils/filters';

export interface LogbookFiltersProps {
  filter: LogbookFilter;
  definition: ReservoirDefinition;
  onChange: (filter: LogbookFilter) => void;
}

const toLocalInput = (iso: string) => (iso ? new Date(iso).toISOString().slice(0, 16) : '');
const fromLocalInput = (v: string) => (v ? new Date(`${v}:00.000Z`).toISOString() : '');

/** Time range (UTC), kind, who and gate: all applied by the gateway. */
export function LogbookFilters({ filter, definition, onChange }: LogbookFiltersProps) {
  const set = (patch: Partial<LogbookFilter>) => onChange({ ...filter, ...patch });
  return (
    <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }} data-testid="logbook-filters">
      <TextField
        size="small"
        type="datetime-local"
        label="From (UTC)"
        value={toLocalInput(filter.from)}
        onChange={(e) => set({ from: fromLocalInput(e.target.value) })}
        slotProps={{ inputLabel: { shrink: true } }}
      />
      <TextField
        size="small"
        type="datetime-local"
        label="To (UTC)"
        value={toLocalInput(filter.to)}
        onChange={(e) => set({ to: fromLocalInput(e.target.value) })}
        slotProps={{ inputLabel: { shrink: true } }}
      />
      <TextField
        select
        size="small"
        label="Kind"
        value={filter.kind}
        onChange={(e) => set({ kind: e.target.value })}
        sx={{ minWidth: 240 }}
        slotProps={{ htmlInput: { 'data-testid': 'logbook-kind' } }}
      >
        <MenuItem value="">Every kind</MenuItem>
        {LOGBOOK_KIND_FILTERS.map((k) => (
          <MenuItem key={k.value} value={k.value}>
            {k.label}
          </MenuItem>
        ))}
      </TextField>
      <TextField
        size="small"
        label="Who (user name)"
        value={filter.actor}
        onChange={(e) => set({ actor: e.target.value.trim() })}
      />
      <TextField
        select
        size="small"
        label="Gate"
        value={filter.gate}
        onChange={(e) => set({ gate: e.target.value })}
        sx={{ minWidth: 200 }}
      >
        <MenuItem value="">Every gate</MenuItem>
        {controlsOf(definition).map((c) => (
          <MenuItem key={c.id} value={c.id}>
            {c.label}
          </MenuItem>
        ))}
      </TextField>
    </Box>
  );
}
