import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { reservoirSummarySchema, type ReservoirSummary } from '@stillwell/shared/telemetry';
import { apiGet } from '../../../lib/api-client';

const reservoirListSchema = z.array(reservoirSummarySchema);

export function getReservoirs(signal?: AbortSignal): Promise<ReservoirSummary[]> {
  return apiGet('/api/reservoirs', reservoirListSchema, { signal });
}

export const reservoirsQueryKey = ['reservoirs'] as const;

export function getReservoirsQueryOptions() {
  return queryOptions({
    queryKey: reservoirsQueryKey,
    queryFn: ({ signal }) => getReservoirs(signal),
    staleTime: 5 * 60_000,
  });
}

export function useReservoirs() {
  return useQuery(getReservoirsQueryOptions());
}
