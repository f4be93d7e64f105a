import { useMutation, useQueryClient } from '@tanstack/react-query';
import { alarmViewSchema, type AlarmView } from '@stillwell/shared/alarms';
import { apiPost } from '../../../lib/api-client';
import { alarmKeys } from './keys';

/** What a person can do to an alarm, with the body each action sends. */
export type AlarmActionRequest =
  | { action: 'acknowledge'; comment?: string }
  | { action: 'shelve'; reason: string; durationS: number }
  | { action: 'out-of-service'; reason: string }
  | { action: 'return-to-service'; comment?: string };

export function postAlarmAction(
  reservoirId: string,
  conditionId: string,
  request: AlarmActionRequest,
): Promise<AlarmView> {
  const { action, ...body } = request;
  return apiPost(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/alarms/${encodeURIComponent(conditionId)}/${action}`,
    body,
    alarmViewSchema,
  );
}

/** One alarm action; the list and the alarm's history are fetched again after it. */
export function useAlarmAction(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ conditionId, request }: { conditionId: string; request: AlarmActionRequest }) =>
      postAlarmAction(reservoirId, conditionId, request),
    onSettled: () => queryClient.invalidateQueries({ queryKey: alarmKeys.all(reservoirId) }),
  });
}
