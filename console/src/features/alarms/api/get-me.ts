import { useQuery } from '@tanstack/react-query';
import { meSchema, type Action } from '@stillwell/shared/access';
import { apiGet } from '../../../lib/api-client';

/**
 * What the signed-in person may do, to offer only the actions that will be allowed (the gateway
 * decides in the end). Unknown while loading or without sign-in: everything is offered then.
 */
export function useMayDo(): (action: Action) => boolean {
  const me = useQuery({
    queryKey: ['auth', 'me'],
    queryFn: ({ signal }) => apiGet('/api/auth/me', meSchema, { signal }),
    staleTime: 60_000,
  });
  const permissions = me.data?.permissions;
  return (action) => (permissions ? permissions.includes(action) : true);
}
