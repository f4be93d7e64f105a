import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { reservoirDefinitionSchema } from '@stillwell/shared/reservoirs';
import { apiGet } from '../../../lib/api-client';

/** GET /api/reservoirs/:id answers with the definition and its version. */
const reservoirResponseSchema = z.object({
  version: z.number().int(),
  definition: reservoirDefinitionSchema,
});
export type ReservoirResponse = z.infer<typeof reservoirResponseSchema>;

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
