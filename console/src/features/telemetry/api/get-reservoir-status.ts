import { queryOptions, useQuery } from '@tanstack/react-query';
import { reservoirStatusSchema, type ReservoirStatus } from '@stillwell/shared/telemetry';
import { apiGet } from '../../../lib/api-client';

export function getReservoirStatus(
  reservoirId: string,
  signal?: AbortSignal,
): Promise<ReservoirStatus> {
  return apiGet(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/status`,
    reservoirStatusSchema,
    { signal },
  );
}

export const reservoirStatusQueryKey = (reservoirId: string) =>
  ['reservoirs', reservoirId, 'status'] as const;

export function getReservoirStatusQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: reservoirStatusQueryKey(reservoirId),
    queryFn: ({ signal }) => getReservoirStatus(reservoirId, signal),
    // Pushed over the live connection about every second; refetched on every (re)subscribe.
    staleTime: Infinity,
  });
}

export function useReservoirStatus(reservoirId: string) {
  return useQuery(getReservoirStatusQueryOptions(reservoirId));
}
