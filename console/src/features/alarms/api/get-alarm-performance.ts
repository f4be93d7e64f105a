import { queryOptions, useQuery } from '@tanstack/react-query';
import { alarmPerformanceSchema, type AlarmPerformance } from '@stillwell/shared/alarms';
import { apiGet } from '../../../lib/api-client';
import { alarmKeys } from './keys';

/** The alarm rates over the last `hours` of site time (the gateway's now). */
export function getAlarmPerformance(
  reservoirId: string,
  hours: number,
  siteNowMs: number,
  signal?: AbortSignal,
): Promise<AlarmPerformance> {
  return apiGet(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/alarms/performance`,
    alarmPerformanceSchema,
    {
      signal,
      query: {
        from: new Date(siteNowMs - hours * 3_600_000).toISOString(),
        to: new Date(siteNowMs).toISOString(),
      },
    },
  );
}

export function getAlarmPerformanceQueryOptions(
  reservoirId: string,
  hours: number,
  siteNowMs: () => number | null,
) {
  return queryOptions({
    queryKey: alarmKeys.performance(reservoirId, hours),
    queryFn: ({ signal }) => {
      const now = siteNowMs();
      if (now === null) throw new Error('the site time is not known yet');
      return getAlarmPerformance(reservoirId, hours, now, signal);
    },
    refetchInterval: 10_000,
  });
}

export function useAlarmPerformance(reservoirId: string, hours: number, siteNowMs: number | null) {
  return useQuery({
    ...getAlarmPerformanceQueryOptions(reservoirId, hours, () => siteNowMs),
    enabled: siteNowMs !== null,
  });
}
