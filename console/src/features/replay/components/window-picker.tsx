import { useState } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import type { ReplayEvent } from '@stillwell/shared/replay';
import { formatSiteTime } from '../../../lib/format';

export interface ReplayRange {
  fromMs: number;
  toMs: number;
}

export interface WindowPickerProps {
  events: readonly ReplayEvent[];
  value: ReplayRange | null;
  timeZone: string;
  onChange: (range: ReplayRange, eventId: string | null) => void;
  selectedEventId: string | null;
}

const at = (ms: number, timeZone: string) => {
  const s = formatSiteTime(ms, timeZone);
  return `${s.date} ${s.time.slice(0, 5)}`;
};

/** "Pool above Watch level: 2 Dec 10:00 to 3 Dec 04:00 GMT, peak 211.3 m". */
export function eventText(e: ReplayEvent, timeZone: string): string {
  const zone = formatSiteTime(e.toMs, timeZone).zone;
  const peak = e.peak ? `, peak ${e.peak.value.toFixed(2)} m` : '';
  const end = e.ongoing ? `${at(e.toMs, timeZone)} (ongoing)` : at(e.toMs, timeZone);
  return `${e.label}: ${at(e.fromMs, timeZone)} to ${end} ${zone}${peak}`;
}

// datetime-local fields are read and written in UTC, and say so
const toField = (ms: number) => new Date(ms).toISOString().slice(0, 16);
const fromField = (text: string) => Date.parse(`${text}:00Z`);

/** Choose an event found in the record, or type a window. */
export function WindowPicker({
  events,
  value,
  timeZone,
  onChange,
  selectedEventId,
}: WindowPickerProps) {
  const [from, setFrom] = useState(value ? toField(value.fromMs) : '');
  const [to, setTo] = useState(value ? toField(value.toMs) : '');
  const [problem, setProblem] = useState<string | null>(null);

  const apply = () => {
    const fromMs = fromField(from);
    const toMs = fromField(to);
    if (!Number.isFinite(fromMs)) return setProblem('From: enter a date and time');
    if (!Number.isFinite(toMs)) return setProblem('To: enter a date and time');
    if (toMs <= fromMs) return setProblem('To: must be after From');
    setProblem(null);
    onChange({ fromMs, toMs }, null);
  };

  return (
    <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1.5, alignItems: 'flex-start' }}>
      <TextField
        select
        size="small"
        label="Event"
        value={selectedEventId ?? ''}
        onChange={(e) => {
          const chosen = events.find((x) => x.id === e.target.value);
          if (!chosen) return;
          setFrom(toField(chosen.fromMs));
          setTo(toField(chosen.toMs));
          onChange({ fromMs: chosen.fromMs, toMs: chosen.toMs }, chosen.id);
        }}
        slotProps={{ htmlInput: { 'data-testid': 'replay-event' } }}
        sx={{ minWidth: 420, flex: '1 1 420px' }}
        helperText={events.length ? undefined : 'No events in the record yet'}
      >
        {events.map((e) => (
          <MenuItem key={e.id} value={e.id} data-testid={`replay-event-${e.kind}`}>
            {eventText(e, timeZone)}
          </MenuItem>
        ))}
      </TextField>
      <TextField
        size="small"
        type="datetime-local"
        label="From (UTC)"
        value={from}
        onChange={(e) => setFrom(e.target.value)}
        slotProps={{ inputLabel: { shrink: true } }}
      />
      <TextField
        size="small"
        type="datetime-local"
        label="To (UTC)"
        value={to}
        onChange={(e) => setTo(e.target.value)}
        slotProps={{ inputLabel: { shrink: true } }}
        error={problem !== null}
        helperText={problem ?? undefined}
      />
      <Button variant="outlined" onClick={apply}>
        Replay this window
      </Button>
    </Box>
  );
}
