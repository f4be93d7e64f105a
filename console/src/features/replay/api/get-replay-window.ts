import { queryOptions, useQuery } from '@tanstack/react-query';
import { replayWindowSchema, type ReplayWindow } from '@stillwell/shared/replay';
import { apiGet } from '../../../lib/api-client';
import { isoOf, replayKeys, replayPath } from './keys';

export function getReplayWindow(
  reservoirId: string,
  fromMs: number,
  toMs: number,
  signal?: AbortSignal,
): Promise<ReplayWindow> {
  return apiGet(replayPath(reservoirId, 'window'), replayWindowSchema, {
    signal,
    query: { from: isoOf(fromMs), to: isoOf(toMs) },
  });
}

export function getReplayWindowQueryOptions(reservoirId: string, fromMs: number, toMs: number) {
  return queryOptions({
    queryKey: replayKeys.window(reservoirId, fromMs, toMs),
    queryFn: ({ signal }) => getReplayWindow(reservoirId, fromMs, toMs, signal),
    // the record of a past window does not change; a window reaching now is refetched on request
    staleTime: Infinity,
  });
}

export function useReplayWindow(
  reservoirId: string,
  range: { fromMs: number; toMs: number } | null,
) {
  return useQuery({
    ...getReplayWindowQueryOptions(reservoirId, range?.fromMs ?? 0, range?.toMs ?? 0),
    enabled: range !== null,
  });
}
