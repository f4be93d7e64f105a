import { queryOptions, useQuery } from '@tanstack/react-query';
import { alarmListSchema, type AlarmList } from '@stillwell/shared/alarms';
import { apiGet } from '../../../lib/api-client';
import { ALARM_REFETCH_MS, alarmKeys } from './keys';

export function getAlarms(reservoirId: string, signal?: AbortSignal): Promise<AlarmList> {
  return apiGet(`/api/reservoirs/${encodeURIComponent(reservoirId)}/alarms`, alarmListSchema, {
    signal,
  });
}

export function getAlarmsQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: alarmKeys.list(reservoirId),
    queryFn: ({ signal }) => getAlarms(reservoirId, signal),
    refetchInterval: ALARM_REFETCH_MS,
    // a console left in a background tab still has to sound and show a new alarm
    refetchIntervalInBackground: true,
  });
}

export function useAlarms(reservoirId: string) {
  return useQuery(getAlarmsQueryOptions(reservoirId));
}
