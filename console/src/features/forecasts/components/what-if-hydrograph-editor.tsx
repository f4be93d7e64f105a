import { useRef, useState, type ChangeEvent } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { GridColDef } from '@mui/x-data-grid';
import type { ForecastRun } from '@stillwell/shared/forecasts';
import { Panel } from '../../../components/ui/panel';
import { siteClockText } from '../utils/format-time';
import type { FormProblem } from '../utils/what-if-request';
import {
  emptyHydrographRow,
  hydrographFromCsv,
  hydrographFromForecast,
  sampleHydrograph,
  type CsvTimeUnit,
  type HydrographRow,
} from '../utils/what-if-tables';
import { WhatIfGrid } from './what-if-grid';

export interface WhatIfHydrographEditorProps {
  rows: readonly HydrographRow[];
  onChange: (rows: HydrographRow[]) => void;
  problems: readonly FormProblem[];
  /** the latest live forecast, to start from its inflow (null: none yet) */
  forecast: ForecastRun | null;
  timeZone: string;
}

const COLUMNS: GridColDef<HydrographRow>[] = [
  { field: 'hour', headerName: 'Time (h from start)', type: 'number', width: 150, editable: true },
  { field: 'flow', headerName: 'Inflow (m³/s)', type: 'number', width: 130, editable: true },
];
const FIELD_OF = { t: 'hour', q: 'flow' };
const LABELS = { t: 'Time', q: 'Inflow' };

interface Source {
  text: string;
  problems: string[];
}

/**
 * The inflow hydrograph: typed in the grid, read from a CSV file (refused whole, its problems by
 * the file's rows, when anything in it is wrong), the live forecast's base inflow, or a sample.
 */
export function WhatIfHydrographEditor({
  rows,
  onChange,
  problems,
  forecast,
  timeZone,
}: WhatIfHydrographEditorProps) {
  const input = useRef<HTMLInputElement>(null);
  const [unit, setUnit] = useState<CsvTimeUnit>('h');
  const [source, setSource] = useState<Source>({
    text: 'A sample flood: 300 m³/s rising to 1,900 m³/s at hour 6, back to 300 m³/s at hour 24.',
    problems: [],
  });

  const upload = async (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    event.target.value = '';
    if (!file) return;
    const read = hydrographFromCsv(await file.text(), unit);
    if (read.problems.length > 0) {
      setSource({
        text: `${file.name} was not loaded: the table below is unchanged.`,
        problems: read.problems,
      });
      return;
    }
    onChange(read.rows);
    setSource({
      text: `${file.name}: ${read.rows.length} rows${read.note ? `. ${read.note}` : ''}`,
      problems: [],
    });
  };

  const fromForecast = () => {
    if (!forecast) return;
    const next = hydrographFromForecast(forecast);
    onChange(next);
    const everyMin = next.length > 1 ? Math.round((next[1]!.hour! - next[0]!.hour!) * 60) : 0;
    setSource({
      text: `The base inflow of the live forecast of ${siteClockText(forecast.computedAtMs, timeZone)} (${forecast.inputs.inflow.method.replace('-', ' ')}), every ${everyMin} min; hour 0 is the forecast's start.`,
      problems: [],
    });
  };

  return (
    <Panel
      title="Inflow hydrograph"
      aside={
        <Typography variant="body2" sx={{ color: 'text.secondary' }}>
          {rows.length} rows
        </Typography>
      }
    >
      <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, alignItems: 'center', mb: 1 }}>
        <Button
          size="small"
          variant="outlined"
          onClick={() => onChange([...rows, emptyHydrographRow(rows.at(-1))])}
        >
          Add row
        </Button>
        <Button size="small" variant="outlined" onClick={() => input.current?.click()}>
          Upload CSV
        </Button>
        <input
          ref={input}
          type="file"
          accept=".csv,text/csv,text/plain"
          hidden
          data-testid="hydrograph-file"
          aria-label="Hydrograph CSV file"
          onChange={(e) => void upload(e)}
        />
        <TextField
          select
          size="small"
          label="CSV times in"
          value={unit}
          onChange={(e) => setUnit(e.target.value as CsvTimeUnit)}
          sx={{ minWidth: 120 }}
        >
          <MenuItem value="s">seconds</MenuItem>
          <MenuItem value="min">minutes</MenuItem>
          <MenuItem value="h">hours</MenuItem>
        </TextField>
        <Button size="small" variant="outlined" disabled={!forecast} onClick={fromForecast}>
          Start from the live forecast
        </Button>
        <Button
          size="small"
          onClick={() => {
            onChange(sampleHydrograph());
            setSource({ text: 'The sample flood.', problems: [] });
          }}
        >
          Sample flood
        </Button>
      </Box>
      <Typography
        variant="body2"
        sx={{ color: 'text.secondary', mb: 1 }}
        data-testid="hydrograph-source"
      >
        {source.text}
      </Typography>
      {source.problems.length > 0 && (
        <Box
          component="ul"
          role="alert"
          aria-label="Problems in the CSV file"
          data-testid="csv-problems"
          sx={{ color: 'signal.alarm', pl: 2.5, mt: 0, fontSize: '0.9rem' }}
        >
          {source.problems.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </Box>
      )}
      <WhatIfGrid
        label="Inflow hydrograph"
        testId="hydrograph-grid"
        rows={rows}
        columns={COLUMNS}
        onRowsChange={onChange}
        problems={problems}
        fieldOf={FIELD_OF}
        columnLabels={LABELS}
      />
      <Typography variant="caption" component="p" sx={{ color: 'text.secondary', mt: 0.5 }}>
        Double-click a cell or press Enter to edit. A CSV file has a header row with a time column
        (time, t, hour) and a flow column (flow, q, inflow, discharge), in m³/s; times in the unit
        chosen, or ISO 8601 date-times with an offset. After its last row the last flow is held.
      </Typography>
    </Panel>
  );
}
