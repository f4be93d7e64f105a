import Chip from '@mui/material/Chip';
import type { Standing } from '@stillwell/shared/notices';
import { ink, signal } from '../../../theme';
import { STANDING_LABELS } from '../utils/board';

const COLOUR: Record<Standing, string> = {
  waiting: ink.secondary,
  told: ink.primary,
  acknowledged: ink.primary,
  silent: signal.caution,
  bounced: signal.alarm,
};

export interface StandingChipProps {
  standing: Standing;
}

/** Grey while all is as it should be; colour only for the silent and the refused (ISA-101). */
export function StandingChip({ standing }: StandingChipProps) {
  const attention = standing === 'silent' || standing === 'bounced';
  return (
    <Chip
      size="small"
      label={STANDING_LABELS[standing]}
      data-standing={standing}
      variant={attention ? 'filled' : 'outlined'}
      sx={{
        color: attention ? signal.onSignal : COLOUR[standing],
        bgcolor: attention ? COLOUR[standing] : undefined,
        borderColor: COLOUR[standing],
        fontWeight: standing === 'acknowledged' ? 600 : 400,
      }}
    />
  );
}
