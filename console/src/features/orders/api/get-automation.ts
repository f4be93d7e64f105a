import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  automaticRuleSchema,
  automationViewSchema,
  type UpdateRuleRequest,
} from '@stillwell/shared/orders';
import { apiGet, apiPut } from '../../../lib/api-client';
import { ordersKeys } from './keys';

const base = (reservoirId: string) =>
  `/api/reservoirs/${encodeURIComponent(reservoirId)}/automation`;

export function getAutomationQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: ordersKeys.automation(reservoirId),
    queryFn: ({ signal }) => apiGet(base(reservoirId), automationViewSchema, { signal }),
    staleTime: Infinity,
  });
}

export function useAutomation(reservoirId: string) {
  return useQuery(getAutomationQueryOptions(reservoirId));
}

export function useUpdateRule(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: { control: string; body: UpdateRuleRequest }) =>
      apiPut(`${base(reservoirId)}/${encodeURIComponent(v.control)}`, v.body, automaticRuleSchema),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: ordersKeys.automation(reservoirId) }),
  });
}
