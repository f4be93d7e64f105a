import Typography from '@mui/material/Typography';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { ProfileScreen } from '../../features/auth/components/profile-screen';
import { useHomeNav } from '../../features/auth/hooks/use-home-nav';
import { useSession } from '../../lib/auth-session';

/** One's own account, open to every role (sessions.own). */
export function ProfileRoute() {
  const me = useSession()?.me;
  return (
    <ConsoleShell reservoirName="Your profile" nav={useHomeNav()}>
      <title>Profile · Stillwell</title>
      {me ? (
        <ProfileScreen me={me} />
      ) : (
        <Typography sx={{ p: 2 }}>This browser is not signed in through the console.</Typography>
      )}
    </ConsoleShell>
  );
}
