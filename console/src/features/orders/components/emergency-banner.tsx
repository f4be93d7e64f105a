import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Me } from '@stillwell/shared/access';
import { EMERGENCY_LEVELS, type Emergency } from '@stillwell/shared/orders';
import { describeError } from '../../../lib/api-client';
import { formatSiteTime } from '../../../lib/format';
import { useDeclareEmergency, useEndEmergency } from '../api/get-emergency';
import { ConfirmIdentityDialog } from './confirm-identity-dialog';
import { useSteppedUp } from './use-stepped-up';

export interface EmergencyBannerProps {
  reservoirId: string;
  timeZone: string;
  emergency: Emergency | null;
  me: Me | null;
}

/** The emergency in force, flagged across the screen; a duty engineer declares and ends it. */
export function EmergencyBanner({ reservoirId, timeZone, emergency, me }: EmergencyBannerProps) {
  const [open, setOpen] = useState(false);
  const [level, setLevel] = useState<1 | 2 | 3>(1);
  const [reason, setReason] = useState('');
  const declare = useDeclareEmergency(reservoirId);
  const end = useEndEmergency(reservoirId);
  const stepped = useSteppedUp();
  const engineer = me?.roles.includes('engineer') ?? false;
  const failed = declare.error ?? end.error;
  const done = () => {
    setOpen(false);
    setReason('');
  };

  if (emergency) {
    const at = formatSiteTime(Date.parse(emergency.declaredAt), timeZone);
    return (
      <Alert
        severity="error"
        variant="filled"
        data-testid="emergency-banner"
        sx={{ alignItems: 'center' }}
        action={
          engineer && (
            <Button color="inherit" size="small" onClick={() => setOpen((v) => !v)}>
              End the emergency
            </Button>
          )
        }
      >
        Emergency level {emergency.level} declared by {emergency.declaredBy.username} at {at.time}{' '}
        {at.zone}: {emergency.reason}. Orders may be sent without prior authorisation; each is
        flagged and must be countersigned by a duty engineer.
        {open && (
          <Box sx={{ display: 'flex', gap: 1, mt: 1 }}>
            <TextField
              size="small"
              label="Why it ends"
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              sx={{ bgcolor: 'background.paper', flexGrow: 1 }}
            />
            <Button
              variant="contained"
              color="inherit"
              disabled={reason.trim().length < 5}
              onClick={() =>
                stepped.run('Ending the emergency', (onError) =>
                  end.mutate(reason, { onSuccess: done, onError: (e) => void onError(e) }),
                )
              }
            >
              End it
            </Button>
          </Box>
        )}
        {failed && <Typography variant="body2">{describeError(failed)}</Typography>}
        <ConfirmIdentityDialog {...stepped.dialog} totpEnabled={me?.totpEnabled ?? false} />
      </Alert>
    );
  }
  return (
    <Box
      sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}
      data-testid="emergency-none"
    >
      <Typography variant="body2" color="text.secondary" sx={{ flexGrow: 1 }}>
        No emergency is declared: every order needs a duty engineer&apos;s authorisation before it
        is sent.
      </Typography>
      {engineer && (
        <Button size="small" color="error" variant="outlined" onClick={() => setOpen((v) => !v)}>
          Declare an emergency
        </Button>
      )}
      {open && (
        <Box sx={{ display: 'flex', gap: 1, width: '100%' }}>
          <TextField
            select
            size="small"
            label="Level (emergency action plan)"
            value={level}
            onChange={(e) => setLevel(Number(e.target.value) as 1 | 2 | 3)}
            sx={{ width: 240 }}
          >
            {EMERGENCY_LEVELS.map((l) => (
              <MenuItem key={l} value={l}>
                Level {l}
              </MenuItem>
            ))}
          </TextField>
          <TextField
            size="small"
            label="Reason"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            sx={{ flexGrow: 1 }}
          />
          <Button
            variant="contained"
            color="error"
            disabled={reason.trim().length < 5}
            onClick={() =>
              stepped.run('Declaring an emergency', (onError) =>
                declare.mutate(
                  { level, reason },
                  { onSuccess: done, onError: (e) => void onError(e) },
                ),
              )
            }
          >
            Declare
          </Button>
        </Box>
      )}
      {failed && (
        <Alert severity="error" sx={{ width: '100%' }}>
          {describeError(failed)}
        </Alert>
      )}
      <ConfirmIdentityDialog {...stepped.dialog} totpEnabled={me?.totpEnabled ?? false} />
    </Box>
  );
}
