import Chip from '@mui/material/Chip';
import Stack from '@mui/material/Stack';
import type { Quality } from '@stillwell/shared/telemetry';
import { signal } from '../../theme';

export interface DoubtFlagsProps {
  stale: boolean;
  /** null: no reading at all */
  quality: Quality | null;
}

/** Says in words, not only in colour, why a value is not to be trusted as current and good. */
export function DoubtFlags({ stale, quality }: DoubtFlagsProps) {
  const flags: string[] = [];
  if (quality === null) flags.push('No data');
  else if (stale) flags.push('Stale');
  if (quality === 'suspect') flags.push('Suspect');
  if (quality === 'bad') flags.push('Bad');
  if (flags.length === 0) return null;
  return (
    <Stack direction="row" spacing={0.5} component="span" sx={{ display: 'inline-flex' }}>
      {flags.map((flag) => (
        <Chip
          key={flag}
          label={flag.toUpperCase()}
          size="small"
          variant={flag === 'Bad' ? 'filled' : 'outlined'}
          sx={
            flag === 'Bad'
              ? { bgcolor: signal.doubt, color: signal.onSignal }
              : { borderColor: signal.doubt, color: signal.doubt }
          }
        />
      ))}
    </Stack>
  );
}
