import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import type { User } from '@stillwell/shared/access';
import { describeError } from '../../../lib/api-client';
import { useResetPassword, useUpdateUser } from '../api/change-user';
import type { RunConfirmed } from '../utils/run-confirmed';

export type AccountAction = 'disable' | 'enable' | 'reset';

export interface AccountActionDialogProps {
  user: User;
  action: AccountAction;
  withStepUp: RunConfirmed;
  /** after a reset: the temporary password, to be shown once */
  onReset: (temporaryPassword: string) => void;
  onClose: () => void;
}

const TEXT: Record<AccountAction, { title: string; body: string; button: string }> = {
  disable: {
    title: 'Disable',
    body: 'The account can no longer sign in, and every session of it ends now, open screens included. Nothing it recorded is removed.',
    button: 'Disable account',
  },
  enable: {
    title: 'Enable',
    body: 'The account can sign in again with its password.',
    button: 'Enable account',
  },
  reset: {
    title: 'Reset the password of',
    body: 'A temporary password replaces the current one and every session of the account ends. Give it to the person in a safe way: they must change it when they sign in.',
    button: 'Reset password',
  },
};

/** Disable, enable or reset an account, after saying what will happen. */
export function AccountActionDialog({
  user,
  action,
  withStepUp,
  onReset,
  onClose,
}: AccountActionDialogProps) {
  const update = useUpdateUser();
  const reset = useResetPassword();
  const [removeTotp, setRemoveTotp] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const text = TEXT[action];

  const confirm = async () => {
    setBusy(true);
    setError(null);
    try {
      const purpose = `${text.button} (${user.username})`;
      if (action === 'reset') {
        const body = removeTotp ? { removeTotp: true } : {};
        const password = await withStepUp(purpose, () => reset.mutateAsync({ id: user.id, body }));
        if (password !== null) onReset(password);
      } else {
        const body = { disabled: action === 'disable' };
        if (await withStepUp(purpose, () => update.mutateAsync({ id: user.id, body }))) onClose();
      }
    } catch (e) {
      setError(describeError(e));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Dialog open onClose={onClose} aria-labelledby="account-action-title">
      <DialogTitle id="account-action-title">
        {text.title} {user.displayName} ({user.username})?
      </DialogTitle>
      <DialogContent sx={{ display: 'grid', gap: 2, width: 480, maxWidth: '100%' }}>
        <DialogContentText>{text.body}</DialogContentText>
        {action === 'reset' && user.totpEnabled && (
          <FormControlLabel
            control={
              <Checkbox checked={removeTotp} onChange={(e) => setRemoveTotp(e.target.checked)} />
            }
            label="Also remove the second factor (the authenticator was lost)"
          />
        )}
        {error && <Alert severity="error">{error}</Alert>}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose}>Cancel</Button>
        <Button
          variant="contained"
          color={action === 'enable' ? 'primary' : 'warning'}
          disabled={busy}
          onClick={() => void confirm()}
          data-testid="account-action-confirm"
        >
          {text.button}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
