import { useState, type FormEvent } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import { totpCodeSchema } from '@stillwell/shared/access';
import { describeError } from '../../../lib/api-client';
import { useSession } from '../../../lib/auth-session';
import { stepUp } from '../api/step-up';

export interface StepUpDialogProps {
  open: boolean;
  /** what is about to be done, in words ("Creating an account") */
  purpose: string;
  onConfirmed: () => void;
  onCancel: () => void;
}

/** Password (and code, where the account has one) again before an act the gateway guards. */
export function StepUpDialog({ open, purpose, onConfirmed, onCancel }: StepUpDialogProps) {
  const totpEnabled = useSession()?.me.totpEnabled ?? false;
  const [password, setPassword] = useState('');
  const [totp, setTotp] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const codeProblem = totpEnabled && !totpCodeSchema.safeParse(totp).success;

  const reset = () => {
    setPassword('');
    setTotp('');
    setError(null);
  };
  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setBusy(true);
    try {
      await stepUp({ password, ...(totpEnabled ? { totp } : {}) });
      reset();
      onConfirmed();
    } catch (e) {
      setError(describeError(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Dialog
      open={open}
      onClose={() => {
        reset();
        onCancel();
      }}
      aria-labelledby="step-up-title"
    >
      <form onSubmit={(e) => void submit(e)} noValidate>
        <DialogTitle id="step-up-title">Confirm it is you</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1, width: 400, maxWidth: '100%' }}>
          <Alert severity="info" variant="outlined">
            {purpose} needs your password again{totpEnabled ? ' and a code' : ''}. It then holds for
            5 minutes.
          </Alert>
          <TextField
            label="Password"
            type="password"
            autoFocus
            autoComplete="current-password"
            value={password}
            onChange={(e) => setPassword(e.target.value)}
            slotProps={{ htmlInput: { 'data-testid': 'step-up-password' } }}
          />
          {totpEnabled && (
            <TextField
              label="Authenticator code"
              inputMode="numeric"
              autoComplete="one-time-code"
              value={totp}
              onChange={(e) => setTotp(e.target.value.trim())}
              helperText="six digits"
            />
          )}
          {error && <Alert severity="error">{error}</Alert>}
        </DialogContent>
        <DialogActions>
          <Button
            onClick={() => {
              reset();
              onCancel();
            }}
          >
            Cancel
          </Button>
          <Button
            type="submit"
            variant="contained"
            disabled={!password || codeProblem || busy}
            data-testid="step-up-confirm"
          >
            Confirm
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
