import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  currentEmergencySchema,
  emergencySchema,
  type CurrentEmergency,
  type DeclareEmergencyRequest,
} from '@stillwell/shared/orders';
import { apiGet, apiPost } from '../../../lib/api-client';
import { ordersKeys } from './keys';

const base = (reservoirId: string) =>
  `/api/reservoirs/${encodeURIComponent(reservoirId)}/emergency`;

export function getEmergencyQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: ordersKeys.emergency(reservoirId),
    queryFn: ({ signal }) => apiGet(base(reservoirId), currentEmergencySchema, { signal }),
    staleTime: Infinity,
  });
}

export function useEmergency(reservoirId: string) {
  return useQuery(getEmergencyQueryOptions(reservoirId));
}

export function useDeclareEmergency(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: DeclareEmergencyRequest) =>
      apiPost(base(reservoirId), body, emergencySchema),
    onSuccess: (emergency) =>
      queryClient.setQueryData<CurrentEmergency>(ordersKeys.emergency(reservoirId), { emergency }),
  });
}

export function useEndEmergency(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string) =>
      apiPost(`${base(reservoirId)}/end`, { reason }, emergencySchema),
    onSuccess: () =>
      queryClient.setQueryData<CurrentEmergency>(ordersKeys.emergency(reservoirId), {
        emergency: null,
      }),
  });
}
