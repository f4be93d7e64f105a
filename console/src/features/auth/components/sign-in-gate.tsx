import { useEffect, useState, type FormEvent, type ReactNode } from 'react';
import {
  Alert,
  Box,
  Button,
  CircularProgress,
  Paper,
  Stack,
  TextField,
  Typography,
} from '@mui/material';
import {
  authorisedOutside,
  onSessionChange,
  refresh,
  session,
  signIn,
} from '../../../lib/auth-session';

export interface SignInGateProps {
  children: ReactNode;
}

/** Shows the console only to a signed-in person; first tries to resume the session from its cookie. */
export function SignInGate({ children }: SignInGateProps) {
  const [signedIn, setSignedIn] = useState(() => session() !== null);
  const [resuming, setResuming] = useState(() => session() === null);

  useEffect(() => onSessionChange((s) => setSignedIn(s !== null)), []);
  useEffect(() => {
    if (session()) return;
    void refresh()
      .then(async (ok) => {
        if (!ok && (await authorisedOutside())) setSignedIn(true);
      })
      .finally(() => setResuming(false));
  }, []);

  if (signedIn) return <>{children}</>;
  if (resuming) {
    return (
      <Box sx={{ display: 'grid', placeItems: 'center', minHeight: '100vh' }}>
        <CircularProgress aria-label="Resuming session" />
      </Box>
    );
  }
  return <SignInForm />;
}

function SignInForm() {
  const [username, setUsername] = useState('');
  const [password, setPassword] = useState('');
  const [totp, setTotp] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    setBusy(true);
    setError(await signIn(username.trim(), password, totp || undefined));
    setBusy(false);
  };

  return (
    <Box sx={{ display: 'grid', placeItems: 'center', minHeight: '100vh', p: 2 }}>
      <Paper
        component="form"
        onSubmit={(e) => void submit(e)}
        sx={{ p: 4, width: 380 }}
        data-testid="sign-in"
      >
        <Stack spacing={2}>
          <Typography variant="overline">Stillwell</Typography>
          <Typography variant="h5">Sign in to the control room</Typography>
          {error && <Alert severity="error">{error}</Alert>}
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
          <TextField
            label="Authenticator code (if enrolled)"
            value={totp}
            onChange={(e) => setTotp(e.target.value)}
            inputMode="numeric"
            autoComplete="one-time-code"
          />
          <Button type="submit" variant="contained" disabled={busy}>
            Sign in
          </Button>
        </Stack>
      </Paper>
    </Box>
  );
}
