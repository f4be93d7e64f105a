import type { ReactNode } from 'react';
import { NavLink, useParams } from 'react-router-dom';
import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import Toolbar from '@mui/material/Toolbar';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { can, ROLE_LABELS, type Action, type Me } from '@stillwell/shared/access';
import { PREVAILING_AUTHORITY } from '@stillwell/shared/forecasts';
import { paths, RESERVOIR_SCREENS } from '../../config/paths';
import { signOut, useSession } from '../../lib/auth-session';
import { accent, ink } from '../../theme';

export interface ShellNavItem {
  label: string;
  to: string;
  /** what the screen needs; a reservoir screen's is found in RESERVOIR_SCREENS when not given */
  action?: Action;
}

export interface ConsoleShellProps {
  /** the reservoir and its dam, when a reservoir is open */
  reservoirName?: string;
  damName?: string;
  nav: readonly ShellNavItem[];
  /** right side of the bar: site clock, connection state, units */
  status?: ReactNode;
  /** a message across the top of the screen, for problems with the live feed */
  notice?: ReactNode;
  children: ReactNode;
}

const navLinkSx = {
  px: 1.5,
  py: 0.75,
  color: ink.secondary,
  fontWeight: 500,
  borderBottom: '2px solid transparent',
  '&.active': { color: ink.primary, borderBottomColor: accent },
  '&:hover': { color: ink.primary },
} as const;

/**
 * The links this person's roles open, by the shared matrix (the gateway decides; this only spares
 * them screens that would refuse). Without a console session nothing is known and nothing is hidden.
 */
function useVisibleNav(nav: readonly ShellNavItem[], me: Me | undefined): ShellNavItem[] {
  const { reservoirId } = useParams();
  if (!me) return [...nav];
  const actionOf = (item: ShellNavItem) =>
    item.action ??
    (reservoirId === undefined
      ? undefined
      : RESERVOIR_SCREENS.find((s) => s.getHref(reservoirId) === item.to)?.action);
  return nav.filter((item) => {
    const action = actionOf(item);
    return action === undefined || can(me.roles, action);
  });
}

/** Who is signed in, with which roles; their profile, the accounts page if theirs, sign-out. */
function SignedInAs({ me }: { me: Me }) {
  return (
    <Box
      data-testid="signed-in-as"
      sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap' }}
    >
      <Box sx={{ minWidth: 0 }}>
        <Typography variant="caption" component="div" sx={{ color: 'text.secondary' }}>
          Signed in as
        </Typography>
        <Typography variant="body2" component="div" sx={{ fontWeight: 500 }}>
          {me.displayName}
        </Typography>
      </Box>
      <Box sx={{ display: 'flex', gap: 0.5 }} aria-label="Your roles">
        {me.roles.map((role) => (
          <Tooltip key={role} title={ROLE_LABELS[role].description}>
            <Chip size="small" variant="outlined" label={ROLE_LABELS[role].title} />
          </Tooltip>
        ))}
      </Box>
      <Box component="nav" aria-label="Account" sx={{ display: 'flex', alignItems: 'center' }}>
        <Link component={NavLink} to={paths.profile.getHref()} underline="none" sx={navLinkSx}>
          Profile
        </Link>
        {can(me.roles, 'users.manage') && (
          <Link component={NavLink} to={paths.users.getHref()} underline="none" sx={navLinkSx}>
            Users
          </Link>
        )}
      </Box>
      <Button size="small" variant="outlined" onClick={() => void signOut()}>
        Sign out
      </Button>
    </Box>
  );
}

/** The frame every screen sits in: who and where on the left, the screens, the plant's state. */
export function ConsoleShell({
  reservoirName,
  damName,
  nav,
  status,
  notice,
  children,
}: ConsoleShellProps) {
  const me = useSession()?.me;
  const visible = useVisibleNav(nav, me);
  return (
    <Box sx={{ minHeight: '100vh', display: 'flex', flexDirection: 'column' }}>
      <AppBar position="sticky">
        <Toolbar sx={{ gap: 3, flexWrap: 'wrap', py: 1 }}>
          <Box sx={{ minWidth: 0 }}>
            <Typography variant="overline" component="div" sx={{ color: 'text.secondary' }}>
              Stillwell
            </Typography>
            <Typography variant="h1" component="div" sx={{ lineHeight: 1.1 }}>
              {reservoirName ?? 'Reservoirs'}
            </Typography>
            {damName && (
              <Typography variant="body2" component="div" sx={{ color: 'text.secondary' }}>
                {damName}
              </Typography>
            )}
          </Box>
          <Box component="nav" aria-label="Screens" sx={{ display: 'flex', gap: 0.5, flexGrow: 1 }}>
            {visible.map((item) => (
              <Link key={item.to} component={NavLink} to={item.to} underline="none" sx={navLinkSx}>
                {item.label}
              </Link>
            ))}
          </Box>
          <Box sx={{ display: 'flex', alignItems: 'center', gap: 2.5, flexWrap: 'wrap' }}>
            {status}
          </Box>
          {me && <SignedInAs me={me} />}
        </Toolbar>
      </AppBar>
      {notice}
      <Box component="main" sx={{ flexGrow: 1, p: { xs: 1.5, md: 2 } }}>
        {children}
      </Box>
      <Box
        component="footer"
        sx={{ px: 2, py: 1, borderTop: 1, borderColor: 'divider', color: 'text.secondary' }}
      >
        <Typography variant="body2" data-testid="decision-support-note">
          Decision support only: {PREVAILING_AUTHORITY} prevail.
        </Typography>
      </Box>
    </Box>
  );
}
