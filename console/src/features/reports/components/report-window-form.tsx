import { useState } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import FormControlLabel from '@mui/material/FormControlLabel';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  REPORT_FORMATS,
  type CreateReportRequest,
  type ReportFormat,
} from '@stillwell/shared/reports';
import { useDemoWindow } from '../api/get-demo-window';
import { fromSiteField, toSiteField } from '../utils/site-time-field';

export interface ReportWindowFormProps {
  reservoirId: string;
  timeZone: string;
  busy: boolean;
  onStart: (request: CreateReportRequest) => void;
}

const FORMAT_LABEL: Record<ReportFormat, string> = {
  pdf: 'PDF with charts',
  json: 'JSON figures',
  csv: 'CSV of every reading',
};

/** The window of the report on the site's clock, the formats, and the button that starts it. */
export function ReportWindowForm({ reservoirId, timeZone, busy, onStart }: ReportWindowFormProps) {
  const demo = useDemoWindow(reservoirId);
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [formats, setFormats] = useState<ReportFormat[]>([...REPORT_FORMATS]);
  const [problem, setProblem] = useState<{ field: 'from' | 'to'; text: string } | null>(null);

  const applyDemo = () => {
    if (!demo.data) return;
    setFrom(toSiteField(Date.parse(demo.data.from), timeZone));
    // the window is half-open; a field holds whole minutes, so round the end up
    setTo(toSiteField(Math.ceil(Date.parse(demo.data.to) / 60_000) * 60_000, timeZone));
    setProblem(null);
  };

  const start = () => {
    const fromMs = fromSiteField(from, timeZone);
    const toMs = fromSiteField(to, timeZone);
    if (!Number.isFinite(fromMs))
      return setProblem({ field: 'from', text: 'From: enter a date and time' });
    if (!Number.isFinite(toMs))
      return setProblem({ field: 'to', text: 'To: enter a date and time' });
    if (toMs <= fromMs) return setProblem({ field: 'to', text: 'To: must be after From' });
    setProblem(null);
    onStart({
      from: new Date(fromMs).toISOString(),
      to: new Date(toMs).toISOString(),
      formats: REPORT_FORMATS.filter((f) => formats.includes(f)),
    });
  };

  const toggle = (f: ReportFormat, on: boolean) =>
    setFormats((now) => (on ? [...now, f] : now.filter((x) => x !== f)));

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1.5, alignItems: 'flex-start' }}>
        <TextField
          size="small"
          type="datetime-local"
          label={`From (site time, ${timeZone})`}
          value={from}
          onChange={(e) => setFrom(e.target.value)}
          slotProps={{ inputLabel: { shrink: true }, htmlInput: { 'data-testid': 'report-from' } }}
          error={problem?.field === 'from'}
          helperText={problem?.field === 'from' ? problem.text : undefined}
        />
        <TextField
          size="small"
          type="datetime-local"
          label={`To (site time, ${timeZone})`}
          value={to}
          onChange={(e) => setTo(e.target.value)}
          slotProps={{ inputLabel: { shrink: true }, htmlInput: { 'data-testid': 'report-to' } }}
          error={problem?.field === 'to'}
          helperText={problem?.field === 'to' ? problem.text : undefined}
        />
        <Button
          variant="text"
          onClick={applyDemo}
          disabled={!demo.data}
          data-testid="report-demo-window"
        >
          Use the demo storm
        </Button>
      </Box>
      {demo.isError && (
        <Typography variant="caption" color="text.secondary">
          No demo storm in the record yet; type a window.
        </Typography>
      )}
      <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, alignItems: 'center' }}>
        {REPORT_FORMATS.map((f) => (
          <FormControlLabel
            key={f}
            label={FORMAT_LABEL[f]}
            control={
              <Checkbox
                size="small"
                checked={formats.includes(f)}
                onChange={(e) => toggle(f, e.target.checked)}
              />
            }
          />
        ))}
        <Button
          variant="contained"
          onClick={start}
          disabled={busy || formats.length === 0}
          data-testid="report-start"
        >
          Produce report
        </Button>
      </Box>
    </Box>
  );
}
