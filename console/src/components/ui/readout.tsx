import type { ReactNode } from 'react';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { Quality } from '@stillwell/shared/telemetry';
import type { Severity } from '../../lib/severity';
import { DoubtFlags } from './doubt-flags';
import { valueColor } from './tone';

export interface ReadoutProps {
  label: string;
  /** the number as text; null when there is nothing to show */
  value: string | null;
  unit: string;
  severity?: Severity;
  stale?: boolean;
  quality?: Quality | null;
  /** a line under the number: where it comes from, what it is measured against */
  caption?: ReactNode;
  /** data-testid of the number itself */
  valueTestId?: string;
}

/** One live number, large enough to read across the room. */
export function Readout({
  label,
  value,
  unit,
  severity = 'normal',
  stale = false,
  quality = 'good',
  caption,
  valueTestId,
}: ReadoutProps) {
  const bad = quality === 'bad';
  return (
    <Paper component="section" aria-label={label} sx={{ p: 1.75, minWidth: 0 }}>
      <Typography variant="overline" component="h2" sx={{ color: 'text.secondary' }}>
        {label}
      </Typography>
      <Box sx={{ display: 'flex', alignItems: 'baseline', gap: 0.75, flexWrap: 'wrap' }}>
        <Typography
          variant="readout"
          data-testid={valueTestId}
          sx={{
            color: value === null ? 'text.disabled' : valueColor(severity, stale, quality),
            // A bad reading stays visible for diagnosis but is struck out, never shown as good.
            textDecoration: bad ? 'line-through' : 'none',
          }}
        >
          {value ?? '—'}
        </Typography>
        <Typography component="span" sx={{ color: 'text.secondary', fontSize: '1rem' }}>
          {unit}
        </Typography>
      </Box>
      <Box sx={{ mt: 0.5, '&:empty': { display: 'none' } }}>
        <DoubtFlags stale={stale} quality={quality} />
      </Box>
      {caption && (
        <Typography variant="body2" component="div" sx={{ color: 'text.secondary', mt: 0.5 }}>
          {caption}
        </Typography>
      )}
    </Paper>
  );
}
