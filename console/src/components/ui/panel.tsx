import type { ReactNode } from 'react';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';

export interface PanelProps {
  title: string;
  /** right side of the title row */
  aside?: ReactNode;
  children: ReactNode;
}

/** A titled region of a screen. */
export function Panel({ title, aside, children }: PanelProps) {
  return (
    <Paper component="section" aria-label={title} sx={{ p: 2, minWidth: 0 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, mb: 1.5, minHeight: 24 }}>
        <Typography variant="h3" component="h2" sx={{ flexGrow: 1, color: 'text.secondary' }}>
          {title}
        </Typography>
        {aside}
      </Box>
      {children}
    </Paper>
  );
}
