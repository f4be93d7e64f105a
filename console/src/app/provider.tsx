import { useState, type ReactNode } from 'react';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import CssBaseline from '@mui/material/CssBaseline';
import { ThemeProvider } from '@mui/material/styles';
import { LiveConnectionProvider } from '../lib/live-connection';
import { createLiveSocket, type LiveSocket } from '../lib/live-socket';
import { createQueryClient } from '../lib/query-client';
import { theme } from '../theme';

export interface AppProviderProps {
  children: ReactNode;
  /** tests pass their own; the app makes one */
  queryClient?: QueryClient;
  socket?: LiveSocket;
}

export function AppProvider({ children, queryClient, socket }: AppProviderProps) {
  const [client] = useState(() => queryClient ?? createQueryClient());
  const [live] = useState(() => socket ?? createLiveSocket());
  return (
    <ThemeProvider theme={theme}>
      <CssBaseline />
      <QueryClientProvider client={client}>
        <LiveConnectionProvider socket={live}>{children}</LiveConnectionProvider>
      </QueryClientProvider>
    </ThemeProvider>
  );
}
