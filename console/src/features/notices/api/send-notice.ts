import { useMutation, useQueryClient } from '@tanstack/react-query';
import { noticeSchema, type Notice } from '@stillwell/shared/notices';
import { apiPost } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function sendNotice(noticeId: string): Promise<Notice> {
  return apiPost(`/api/notices/${enc(noticeId)}/send`, {}, noticeSchema);
}

export function useSendNotice(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (noticeId: string) => sendNotice(noticeId),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: noticesKeys.board(reservoirId) });
      await queryClient.invalidateQueries({ queryKey: noticesKeys.outbox() });
    },
  });
}
