import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { valueColor } from '../../../components/ui/tone';
import { DoubtFlags } from '../../../components/ui/doubt-flags';
import type { Countdown } from '../utils/countdown';

export interface TimeLeftCountdownProps {
  countdown: Countdown;
  /** what the standard plan does, e.g. "open all 3 spillway gates fully (9.00 m)" */
  planLabel: string | null;
}

/**
 * "Time left to act": the latest start of the standard plan as a countdown in site time, big
 * enough to read across the room, with its state said in words as well as in colour.
 */
export function TimeLeftCountdown({ countdown, planLabel }: TimeLeftCountdownProps) {
  const color = valueColor(countdown.severity, countdown.stale, 'good');
  return (
    <Paper
      component="section"
      aria-label="Time left to act"
      data-testid="time-left"
      data-state={countdown.state}
      sx={{
        p: 1.75,
        minWidth: 0,
        borderColor: countdown.severity === 'normal' ? undefined : color,
      }}
    >
      <Typography variant="overline" component="h2" sx={{ color: 'text.secondary' }}>
        Time left to act
      </Typography>
      <Box sx={{ display: 'flex', alignItems: 'baseline', gap: 1.5, flexWrap: 'wrap' }}>
        <Typography
          variant="readout"
          data-testid="time-left-clock"
          sx={{ color, fontSize: '2.6rem', letterSpacing: '0.02em' }}
        >
          {countdown.clock}
        </Typography>
        <Typography
          component="span"
          data-testid="time-left-headline"
          sx={{ color, fontWeight: 500, fontSize: '1.1rem' }}
        >
          {countdown.headline}
        </Typography>
      </Box>
      <Box sx={{ mt: 0.5, '&:empty': { display: 'none' } }}>
        <DoubtFlags stale={countdown.stale && countdown.state !== 'none'} quality="good" />
      </Box>
      <Typography variant="body2" component="div" sx={{ color: 'text.secondary', mt: 0.5 }}>
        {countdown.detail}
      </Typography>
      {planLabel && (
        <Typography variant="body2" component="div" sx={{ color: 'text.secondary', mt: 0.5 }}>
          Standard plan: {planLabel}, at the gates&apos; travel speed.
        </Typography>
      )}
    </Paper>
  );
}
