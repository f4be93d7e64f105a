import type { ReactNode } from 'react';
import { NavLink } from 'react-router-dom';
import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { accent, ink } from '../../theme';

export interface ShellNavItem {
  label: string;
  to: string;
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

/** The frame every screen sits in: who and where on the left, the screens, the plant's state. */
export function ConsoleShell({
  reservoirName,
  damName,
  nav,
  status,
  notice,
  children,
}: ConsoleShellProps) {
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
            {nav.map((item) => (
              <Link
                key={item.to}
                component={NavLink}
                to={item.to}
                underline="none"
                sx={{
                  px: 1.5,
                  py: 0.75,
                  color: ink.secondary,
                  fontWeight: 500,
                  borderBottom: '2px solid transparent',
                  '&.active': { color: ink.primary, borderBottomColor: accent },
                  '&:hover': { color: ink.primary },
                }}
              >
                {item.label}
              </Link>
            ))}
          </Box>
          <Box sx={{ display: 'flex', alignItems: 'center', gap: 2.5, flexWrap: 'wrap' }}>
            {status}
          </Box>
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
          Decision support only: the dam&apos;s approved operating rules, its emergency action plan
          and the responsible engineer prevail.
        </Typography>
      </Box>
    </Box>
  );
}
