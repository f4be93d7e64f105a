import type { ReactNode } from 'react';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';

/** The card the sign-in and first-password screens sit in, alone on the page. */
export function CenteredCard({ children }: { children: ReactNode }) {
  return (
    <Box component="main" sx={{ display: 'grid', placeItems: 'center', minHeight: '100vh', p: 2 }}>
      <Paper sx={{ p: 4, width: 420, maxWidth: '100%' }}>{children}</Paper>
    </Box>
  );
}
