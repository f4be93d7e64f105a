import { queryOptions, useQuery } from '@tanstack/react-query';
import { damSafetySchema, type DamSafety } from '@stillwell/shared/alarms';
import { apiGet } from '../../../lib/api-client';

export const damSafetyReservoirKey = (reservoirId: string) => ['dam-safety', reservoirId] as const;
export const damSafetyKey = (reservoirId: string, days: number) =>
  [...damSafetyReservoirKey(reservoirId), days] as const;

/** Dam-safety readings come every few minutes of site time: fetching again this often is plenty. */
export const DAM_SAFETY_POLL_MS = 15_000;

export function getDamSafety(
  reservoirId: string,
  days: number,
  signal?: AbortSignal,
): Promise<DamSafety> {
  // the range ends at the gateway's site time; only its length is chosen here
  return apiGet(`/api/reservoirs/${encodeURIComponent(reservoirId)}/dam-safety`, damSafetySchema, {
    signal,
    query: { days: String(days) },
  });
}

export function getDamSafetyQueryOptions(reservoirId: string, days: number) {
  return queryOptions({
    queryKey: damSafetyKey(reservoirId, days),
    queryFn: ({ signal }) => getDamSafety(reservoirId, days, signal),
    refetchInterval: DAM_SAFETY_POLL_MS,
  });
}

export function useDamSafety(reservoirId: string, days: number) {
  return useQuery(getDamSafetyQueryOptions(reservoirId, days));
}
