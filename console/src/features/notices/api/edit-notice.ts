import { useMutation, useQueryClient } from '@tanstack/react-query';
import { noticeSchema, type Notice, type NoticeEdit } from '@stillwell/shared/notices';
import { apiPut } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function editNotice(noticeId: string, edit: NoticeEdit): Promise<Notice> {
  return apiPut(`/api/notices/${enc(noticeId)}/wording`, edit, noticeSchema);
}

export function useEditNotice(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ noticeId, edit }: { noticeId: string; edit: NoticeEdit }) =>
      editNotice(noticeId, edit),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: noticesKeys.board(reservoirId) }),
  });
}
