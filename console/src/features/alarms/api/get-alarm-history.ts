import { queryOptions, useQuery } from '@tanstack/react-query';
import { alarmHistorySchema, type AlarmHistory } from '@stillwell/shared/alarms';
import { apiGet } from '../../../lib/api-client';
import { ALARM_REFETCH_MS, alarmKeys } from './keys';

export function getAlarmHistory(
  reservoirId: string,
  conditionId: string,
  signal?: AbortSignal,
): Promise<AlarmHistory> {
  return apiGet(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/alarms/${encodeURIComponent(conditionId)}/history`,
    alarmHistorySchema,
    { signal },
  );
}

export function getAlarmHistoryQueryOptions(reservoirId: string, conditionId: string) {
  return queryOptions({
    queryKey: alarmKeys.history(reservoirId, conditionId),
    queryFn: ({ signal }) => getAlarmHistory(reservoirId, conditionId, signal),
    refetchInterval: ALARM_REFETCH_MS,
  });
}

export function useAlarmHistory(reservoirId: string, conditionId: string | null) {
  return useQuery({
    ...getAlarmHistoryQueryOptions(reservoirId, conditionId ?? ''),
    enabled: conditionId !== null,
  });
}
