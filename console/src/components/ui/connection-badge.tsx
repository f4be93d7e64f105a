import Box from '@mui/material/Box';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import type { LiveConnectionState } from '../../lib/live-connection';
import { ink, signal } from '../../theme';

export interface ConnectionBadgeProps {
  state: LiveConnectionState;
}

const LOOK: Record<LiveConnectionState, { label: string; color: string; hint: string }> = {
  connected: { label: 'Connected', color: ink.secondary, hint: 'Live data is arriving.' },
  connecting: {
    label: 'Connecting',
    color: signal.caution,
    hint: 'Opening the live connection; values are not live yet.',
  },
  reconnecting: {
    label: 'Reconnecting',
    color: signal.caution,
    hint: 'The live connection was lost; values shown may be out of date.',
  },
  offline: {
    label: 'Offline',
    color: signal.alarm,
    hint: 'No live connection; values shown are not current.',
  },
};

/** The live connection's state; grey when all is well, coloured when it is not. */
export function ConnectionBadge({ state }: ConnectionBadgeProps) {
  const look = LOOK[state];
  return (
    <Tooltip title={look.hint}>
      <Box
        role="status"
        aria-live="polite"
        sx={{ display: 'flex', alignItems: 'center', gap: 1, color: look.color }}
      >
        <Box
          aria-hidden
          sx={{
            width: 10,
            height: 10,
            borderRadius: '50%',
            border: `2px solid ${look.color}`,
            bgcolor: state === 'connected' ? look.color : 'transparent',
          }}
        />
        <Typography
          component="span"
          data-testid="connection-state"
          data-state={state}
          sx={{ fontWeight: 500, fontSize: '0.9rem' }}
        >
          {look.label}
        </Typography>
      </Box>
    </Tooltip>
  );
}
