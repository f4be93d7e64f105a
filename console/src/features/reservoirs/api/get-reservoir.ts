import { queryOptions, useQuery } from '@tanstack/react-query';
import { reservoirResponseSchema, type ReservoirResponse } from '@stillwell/shared/reservoirs';
import { apiGet } from '../../../lib/api-client';

export type { ReservoirResponse };

export function getReservoir(
  reservoirId: string,
  signal?: AbortSignal,
): Promise<ReservoirResponse> {
  return apiGet(`/api/reservoirs/${encodeURIComponent(reservoirId)}`, reservoirResponseSchema, {
    signal,
  });
}

export const reservoirQueryKey = (reservoirId: string) => ['reservoirs', reservoirId] as const;

export function getReservoirQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: reservoirQueryKey(reservoirId),
    queryFn: ({ signal }) => getReservoir(reservoirId, signal),
    // A definition changes by an administrator's edit, rarely; its version says when.
    staleTime: 5 * 60_000,
  });
}

export function useReservoir(reservoirId: string) {
  return useQuery(getReservoirQueryOptions(reservoirId));
}
