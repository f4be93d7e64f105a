import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { replayForecastSchema, type ReplayForecast } from '@stillwell/shared/replay';
import { apiGet } from '../../../lib/api-client';
import { replayKeys, replayPath } from './keys';

export function getReplayForecast(
  reservoirId: string,
  runId: number,
  signal?: AbortSignal,
): Promise<ReplayForecast> {
  return apiGet(replayPath(reservoirId, `forecast-runs/${runId}`), replayForecastSchema, {
    signal,
  });
}

export function getReplayForecastQueryOptions(reservoirId: string, runId: number) {
  return queryOptions({
    queryKey: replayKeys.forecast(reservoirId, runId),
    queryFn: ({ signal }) => getReplayForecast(reservoirId, runId, signal),
    // a stored run never changes
    staleTime: Infinity,
  });
}

/** The run standing at the replay's moment; the previous one stays shown while the next loads. */
export function useReplayForecast(reservoirId: string, runId: number | null) {
  return useQuery({
    ...getReplayForecastQueryOptions(reservoirId, runId ?? 0),
    enabled: runId !== null,
    placeholderData: keepPreviousData,
  });
}
