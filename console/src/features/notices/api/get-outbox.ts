import { queryOptions, useQuery } from '@tanstack/react-query';
import { outboxListSchema, type OutboxMessage } from '@stillwell/shared/notices';
import { apiGet } from '../../../lib/api-client';
import { noticesKeys } from './keys';

export function getOutbox(signal?: AbortSignal): Promise<OutboxMessage[]> {
  return apiGet('/api/mail/outbox', outboxListSchema, { signal });
}

export function getOutboxQueryOptions() {
  return queryOptions({
    queryKey: noticesKeys.outbox(),
    queryFn: ({ signal }) => getOutbox(signal),
    refetchInterval: 5000,
  });
}

export function useOutbox() {
  return useQuery(getOutboxQueryOptions());
}
