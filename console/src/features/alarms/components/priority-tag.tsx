import Box from '@mui/material/Box';
import type { Priority } from '@stillwell/shared/alarms';
import { ink, signal } from '../../../theme';
import { priorityLabel } from '../utils/alarm-text';

export interface PriorityTagProps {
  priority: Priority;
  /** an alarm nobody has acknowledged yet is drawn solid; once seen, in outline */
  solid: boolean;
}

const COLOR: Record<Priority, string> = {
  immediate: signal.alarm,
  prompt: signal.caution,
  advisory: ink.secondary,
};

/** The priority as a word, so it reads without colour; colour only adds to it. */
export function PriorityTag({ priority, solid }: PriorityTagProps) {
  const color = COLOR[priority];
  return (
    <Box
      component="span"
      data-testid={`priority-${priority}`}
      sx={{
        display: 'inline-block',
        minWidth: 84,
        px: 0.75,
        py: 0.25,
        borderRadius: 0.5,
        border: `1px solid ${color}`,
        bgcolor: solid ? color : 'transparent',
        color: solid ? signal.onSignal : color,
        fontSize: 12,
        fontWeight: 700,
        letterSpacing: 0.6,
        textTransform: 'uppercase',
        textAlign: 'center',
      }}
    >
      {priorityLabel(priority)}
    </Box>
  );
}
