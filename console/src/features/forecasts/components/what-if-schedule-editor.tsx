import { useMemo } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { GridColDef } from '@mui/x-data-grid';
import type { OrderControl } from '@stillwell/shared/orders';
import { Panel } from '../../../components/ui/panel';
import type { FormProblem } from '../utils/what-if-request';
import {
  emptyScheduleRow,
  openAllGates,
  type ScheduleDraft,
  type ScheduleGridRow,
} from '../utils/what-if-tables';
import { WhatIfGrid } from './what-if-grid';

export interface WhatIfScheduleEditorProps {
  side: 'a' | 'b';
  draft: ScheduleDraft;
  onChange: (draft: ScheduleDraft) => void;
  controls: readonly OrderControl[];
  /** the schedule's rows' problems */
  problems: readonly FormProblem[];
  /** the name's problems */
  nameProblems: readonly FormProblem[];
}

const FIELD_OF = { time: 'hour', id: 'control', target: 'target' };
const LABELS = { time: 'Time', id: 'Gate / outlet', target: 'Opening' };

/**
 * One gate schedule: its name, then rows "from this hour, move this gate or valve towards this
 * opening" (at its travel speed, as the routing does). Gates and valves not named stay as they
 * start.
 */
export function WhatIfScheduleEditor({
  side,
  draft,
  onChange,
  controls,
  problems,
  nameProblems,
}: WhatIfScheduleEditorProps) {
  const columns = useMemo<GridColDef<ScheduleGridRow>[]>(
    () => [
      { field: 'hour', headerName: 'Hour', type: 'number', width: 76, editable: true },
      {
        field: 'control',
        headerName: 'Gate / outlet',
        type: 'singleSelect',
        // takes what the narrow panel leaves, so the delete button stays in view
        flex: 1,
        minWidth: 96,
        editable: true,
        valueOptions: controls.map((c) => ({ value: c.id, label: c.id })),
      },
      {
        field: 'target',
        headerName: 'Opening',
        type: 'number',
        width: 80,
        editable: true,
      },
      {
        field: 'unit',
        headerName: '',
        width: 76,
        sortable: false,
        valueGetter: (_v, row) => {
          const c = controls.find((x) => x.id === row.control);
          return c ? `${c.unit} (≤ ${c.max})` : '';
        },
      },
    ],
    [controls],
  );
  const letter = side.toUpperCase();
  const nameError = nameProblems.map((p) => p.message).join('; ');
  const setRows = (rows: ScheduleGridRow[]) => onChange({ ...draft, rows });
  const firstGateOpen = draft.rows.find((r) => r.control.startsWith('gate'))?.hour ?? 0;

  return (
    <Panel title={`Schedule ${letter}`}>
      <TextField
        size="small"
        fullWidth
        label={`Name of schedule ${letter}`}
        value={draft.name}
        onChange={(e) => onChange({ ...draft, name: e.target.value })}
        error={nameError !== ''}
        helperText={nameError || ' '}
        slotProps={{ htmlInput: { 'data-testid': `schedule-${side}-name`, maxLength: 120 } }}
      />
      <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, mb: 1 }}>
        <Button
          size="small"
          variant="outlined"
          onClick={() => setRows([...draft.rows, emptyScheduleRow(draft.rows.at(-1), controls)])}
        >
          Add row
        </Button>
        <Button size="small" onClick={() => setRows(openAllGates(controls, firstGateOpen))}>
          All gates fully open
        </Button>
      </Box>
      <WhatIfGrid
        label={`Schedule ${letter}`}
        testId={`schedule-${side}-grid`}
        rows={draft.rows}
        columns={columns}
        onRowsChange={setRows}
        problems={problems}
        fieldOf={FIELD_OF}
        columnLabels={LABELS}
      />
      <Typography variant="caption" component="p" sx={{ color: 'text.secondary', mt: 0.5 }}>
        From each row&apos;s hour the gate (m) or valve (%) moves to the opening at its travel
        speed. Gates and valves without a row keep their opening at the start.
      </Typography>
    </Panel>
  );
}
