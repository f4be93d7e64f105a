import { queryOptions, useQuery } from '@tanstack/react-query';
import { replayEventListSchema, type ReplayEventList } from '@stillwell/shared/replay';
import { apiGet } from '../../../lib/api-client';
import { replayKeys, replayPath } from './keys';

export function getReplayEvents(
  reservoirId: string,
  signal?: AbortSignal,
): Promise<ReplayEventList> {
  return apiGet(replayPath(reservoirId, 'events'), replayEventListSchema, { signal });
}

export function getReplayEventsQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: replayKeys.events(reservoirId),
    queryFn: ({ signal }) => getReplayEvents(reservoirId, signal),
    staleTime: 30_000,
  });
}

export function useReplayEvents(reservoirId: string) {
  return useQuery(getReplayEventsQueryOptions(reservoirId));
}
