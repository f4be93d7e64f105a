import { useState, type FormEvent } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { signIn, type SignInRefusal } from '../../../lib/auth-session';
import { CenteredCard } from './centered-card';

function refusalText(refusal: SignInRefusal): string {
  switch (refusal.code) {
    case 'invalid-credentials':
      return 'The username or password is not right.';
    case 'totp-required':
      return 'This account has a second factor: enter the code from your authenticator.';
    case 'totp-invalid':
      return 'That code is not right (or was used already). Wait for the next one.';
    case 'too-many-attempts':
    case 'too-many-requests':
      return `Too many attempts. Try again in ${refusal.retryAfterS ?? 60} s.`;
    default:
      return refusal.message;
  }
}

/** Username and password; the code field appears when the gateway asks for it. */
export function SignInForm() {
  const [username, setUsername] = useState('');
  const [password, setPassword] = useState('');
  const [totp, setTotp] = useState('');
  const [askCode, setAskCode] = useState(false);
  const [refusal, setRefusal] = useState<SignInRefusal | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setBusy(true);
    const answer = await signIn(username.trim(), password, totp.trim() || undefined);
    setBusy(false);
    setRefusal(answer);
    if (answer?.code === 'totp-required' || answer?.code === 'totp-invalid') setAskCode(true);
  };

  return (
    <CenteredCard>
      <Stack
        component="form"
        spacing={2}
        onSubmit={(e) => void submit(e)}
        data-testid="sign-in"
        noValidate
      >
        <Typography variant="overline">Stillwell</Typography>
        <Typography variant="h5" component="h1">
          Sign in to the control room
        </Typography>
        {refusal && (
          <Alert severity={refusal.code === 'totp-required' ? 'info' : 'error'} role="alert">
            {refusalText(refusal)}
          </Alert>
        )}
        <TextField
          label="Username"
          value={username}
          onChange={(e) => setUsername(e.target.value)}
          autoComplete="username"
          autoFocus
          required
        />
        <TextField
          label="Password"
          type="password"
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          autoComplete="current-password"
          required
        />
        {askCode && (
          <TextField
            label="Authenticator code"
            value={totp}
            onChange={(e) => setTotp(e.target.value)}
            inputMode="numeric"
            autoComplete="one-time-code"
            autoFocus
            helperText="six digits from your authenticator app"
          />
        )}
        <Button type="submit" variant="contained" disabled={busy || !username || !password}>
          Sign in
        </Button>
      </Stack>
    </CenteredCard>
  );
}
