import { queryOptions, useQuery } from '@tanstack/react-query';
import { forecastUpdateSchema, type ForecastUpdate } from '@stillwell/shared/forecasts';
import { apiGet } from '../../../lib/api-client';

export function getLatestForecast(
  reservoirId: string,
  signal?: AbortSignal,
): Promise<ForecastUpdate> {
  return apiGet(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/forecasts/latest`,
    forecastUpdateSchema,
    { signal },
  );
}

export const latestForecastQueryKey = (reservoirId: string) =>
  ['reservoirs', reservoirId, 'forecast', 'latest'] as const;

export function getLatestForecastQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: latestForecastQueryKey(reservoirId),
    queryFn: ({ signal }) => getLatestForecast(reservoirId, signal),
    // pushed after every run over the live connection; refetched on every (re)subscribe
    staleTime: Infinity,
  });
}

export function useLatestForecast(reservoirId: string) {
  return useQuery(getLatestForecastQueryOptions(reservoirId));
}
