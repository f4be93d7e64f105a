import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Typography from '@mui/material/Typography';
import { fonts } from '../../../theme';

export interface TemporaryPasswordDialogProps {
  username: string;
  password: string;
  onClose: () => void;
}

/** The temporary password, shown this once: the gateway keeps only its hash. */
export function TemporaryPasswordDialog({
  username,
  password,
  onClose,
}: TemporaryPasswordDialogProps) {
  const [copied, setCopied] = useState(false);
  const copy = () =>
    navigator.clipboard?.writeText(password).then(
      () => setCopied(true),
      () => setCopied(false),
    );
  return (
    <Dialog open onClose={onClose} aria-labelledby="temporary-password-title">
      <DialogTitle id="temporary-password-title">Temporary password for {username}</DialogTitle>
      <DialogContent sx={{ display: 'grid', gap: 2, width: 480, maxWidth: '100%' }}>
        <Typography
          data-testid="temporary-password"
          sx={{ fontFamily: fonts.mono, fontSize: '1.2rem', userSelect: 'all' }}
        >
          {password}
        </Typography>
        <Alert severity="warning" variant="outlined">
          It is shown only now. Give it to the person in a safe way; they choose their own password
          when they first sign in.
        </Alert>
      </DialogContent>
      <DialogActions>
        <Button onClick={() => void copy()}>{copied ? 'Copied' : 'Copy'}</Button>
        <Button variant="contained" onClick={onClose}>
          Done
        </Button>
      </DialogActions>
    </Dialog>
  );
}
