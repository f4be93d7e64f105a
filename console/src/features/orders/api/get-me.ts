import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { meSchema, stepUpResponseSchema } from '@stillwell/shared/access';
import { apiGet, apiPost } from '../../../lib/api-client';
import { ordersKeys } from './keys';

/** Who is signed in: the screens explain what this person may do, the gateway decides. */
export function getMeQueryOptions() {
  return queryOptions({
    queryKey: ordersKeys.me(),
    queryFn: ({ signal }) => apiGet('/api/auth/me', meSchema, { signal }),
    staleTime: 60_000,
  });
}

export function useMe() {
  return useQuery(getMeQueryOptions());
}

/** Re-confirms identity (password, and code where the account has one) before an authorising act. */
export function useStepUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { password: string; totp?: string }) =>
      apiPost('/api/auth/step-up', body, stepUpResponseSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ordersKeys.me() }),
  });
}
