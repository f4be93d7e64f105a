import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** Client errors will not get better by asking again; network and server errors might. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < 3;
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        retry: shouldRetry,
        // Live queries are kept current by the socket, not by window focus.
        refetchOnWindowFocus: false,
      },
    },
  });
}
