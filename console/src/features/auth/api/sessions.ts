import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { sessionSchema } from '@stillwell/shared/access';
import { apiGet } from '../../../lib/api-client';
import { authKeys } from './keys';
import { apiSend } from './send';

export function getSessionsQueryOptions() {
  return queryOptions({
    queryKey: authKeys.sessions(),
    queryFn: ({ signal }) => apiGet('/api/auth/sessions', z.array(sessionSchema), { signal }),
  });
}

/** One's own live sessions (this browser's among them). */
export function useSessions() {
  return useQuery(getSessionsQueryOptions());
}

export function endSession(id: string): Promise<void> {
  return apiSend('DELETE', `/api/auth/sessions/${encodeURIComponent(id)}`, undefined, null);
}

export function endOtherSessions(): Promise<{ ended: number }> {
  return apiSend('DELETE', '/api/auth/sessions', undefined, z.object({ ended: z.number() }));
}

/** `id` ends that session; null ends every other one. */
export function useEndSessions() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (id: string | null): Promise<void> => {
      if (id) await endSession(id);
      else await endOtherSessions();
    },
    onSettled: () => queryClient.invalidateQueries({ queryKey: authKeys.sessions() }),
  });
}
