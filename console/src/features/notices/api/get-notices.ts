import { queryOptions, useQuery } from '@tanstack/react-query';
import { noticeListSchema, type Notice } from '@stillwell/shared/notices';
import { apiGet } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function getNotices(reservoirId: string, signal?: AbortSignal): Promise<Notice[]> {
  return apiGet(`/api/reservoirs/${enc(reservoirId)}/notices`, noticeListSchema, { signal });
}

export function getNoticesQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: noticesKeys.board(reservoirId),
    queryFn: ({ signal }) => getNotices(reservoirId, signal),
    // standings change with the site clock (told -> silent) and with acknowledgements from outside
    refetchInterval: 5000,
  });
}

export function useNotices(reservoirId: string) {
  return useQuery(getNoticesQueryOptions(reservoirId));
}
