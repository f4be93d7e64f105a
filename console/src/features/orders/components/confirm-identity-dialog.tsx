import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import { describeError } from '../../../lib/api-client';
import { useStepUp } from '../api/get-me';

export interface ConfirmIdentityDialogProps {
  open: boolean;
  /** what is about to be done, in words */
  purpose: string;
  totpEnabled: boolean;
  onConfirmed: () => void;
  onCancel: () => void;
}

/** Password (and code) again before an authorising act: the gateway asks for it (step-up). */
export function ConfirmIdentityDialog({
  open,
  purpose,
  totpEnabled,
  onConfirmed,
  onCancel,
}: ConfirmIdentityDialogProps) {
  const [password, setPassword] = useState('');
  const [totp, setTotp] = useState('');
  const stepUp = useStepUp();
  const submit = () =>
    stepUp.mutate(
      { password, ...(totpEnabled ? { totp } : {}) },
      {
        onSuccess: () => {
          setPassword('');
          setTotp('');
          onConfirmed();
        },
      },
    );
  return (
    <Dialog open={open} onClose={onCancel} aria-labelledby="confirm-identity-title">
      <DialogTitle id="confirm-identity-title">Confirm it is you</DialogTitle>
      <DialogContent sx={{ display: 'grid', gap: 2, pt: 1, minWidth: 360 }}>
        <Alert severity="info" variant="outlined">
          {purpose} needs your password again.
        </Alert>
        <TextField
          label="Password"
          type="password"
          autoFocus
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          onKeyDown={(e) => e.key === 'Enter' && submit()}
          slotProps={{ htmlInput: { 'data-testid': 'step-up-password' } }}
        />
        {totpEnabled && (
          <TextField
            label="Authenticator code"
            value={totp}
            onChange={(e) => setTotp(e.target.value)}
          />
        )}
        {stepUp.isError && <Alert severity="error">{describeError(stepUp.error)}</Alert>}
      </DialogContent>
      <DialogActions>
        <Button onClick={onCancel}>Cancel</Button>
        <Button
          variant="contained"
          onClick={submit}
          disabled={!password || stepUp.isPending}
          data-testid="step-up-confirm"
        >
          Confirm
        </Button>
      </DialogActions>
    </Dialog>
  );
}
