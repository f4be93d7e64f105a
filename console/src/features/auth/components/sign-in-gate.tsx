import { useEffect, useState, type ReactNode } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import {
  authorisedOutside,
  onSessionChange,
  refresh,
  session,
  useSession,
} from '../../../lib/auth-session';
import { useLiveRenewal } from '../hooks/use-live-renewal';
import { FirstPassword } from './first-password';
import { SignInForm } from './sign-in-form';

export interface SignInGateProps {
  children: ReactNode;
}

/**
 * Shows the console only to a signed-in person; first tries to resume the session from its cookie.
 * A temporary password is replaced before anything else opens.
 */
export function SignInGate({ children }: SignInGateProps) {
  const current = useSession();
  const [outside, setOutside] = useState(false);
  const [resuming, setResuming] = useState(() => current === null);
  const queryClient = useQueryClient();
  useLiveRenewal();

  // What one person's screens fetched is not shown to the next one at this browser. Cleared as the
  // session changes, before the next person's screens mount and start their own queries.
  useEffect(() => {
    let lastUser = session()?.me.id ?? null;
    return onSessionChange((next) => {
      const userId = next?.me.id ?? null;
      if (userId !== lastUser) queryClient.clear();
      lastUser = userId;
    });
  }, [queryClient]);

  useEffect(() => {
    if (current) return;
    void refresh()
      .catch(() => false)
      .then(async (ok) => {
        if (!ok && (await authorisedOutside())) setOutside(true);
      })
      .finally(() => setResuming(false));
    // once, at start
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  if (current?.me.mustChangePassword) return <FirstPassword me={current.me} />;
  if (current || outside) return <>{children}</>;
  if (resuming) {
    return (
      <Box sx={{ display: 'grid', placeItems: 'center', minHeight: '100vh' }}>
        <CircularProgress aria-label="Resuming session" />
      </Box>
    );
  }
  return <SignInForm />;
}
