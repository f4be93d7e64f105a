import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Me } from '@stillwell/shared/access';
import { signOut } from '../../../lib/auth-session';
import { CenteredCard } from './centered-card';
import { ChangePasswordForm } from './change-password-form';

export interface FirstPasswordProps {
  me: Me;
}

/**
 * After an administrator created the account or reset its password: the gateway answers nothing
 * but the account's own routes until the person has chosen a password of their own.
 */
export function FirstPassword({ me }: FirstPasswordProps) {
  return (
    <CenteredCard>
      <Stack spacing={2} data-testid="first-password">
        <Typography variant="overline">Stillwell</Typography>
        <Typography variant="h5" component="h1">
          Choose your own password
        </Typography>
        <Alert severity="info" variant="outlined">
          Signed in as {me.displayName} ({me.username}) with a temporary password from an
          administrator. Choose a password only you know to continue.
        </Alert>
        <ChangePasswordForm me={me} currentLabel="Temporary password" />
        <Button onClick={() => void signOut()}>Sign out</Button>
      </Stack>
    </CenteredCard>
  );
}
