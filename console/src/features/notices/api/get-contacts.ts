import { queryOptions, useQuery } from '@tanstack/react-query';
import { contactListSchema, type Contact } from '@stillwell/shared/notices';
import { apiGet } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function getContacts(reservoirId: string, signal?: AbortSignal): Promise<Contact[]> {
  return apiGet(`/api/reservoirs/${enc(reservoirId)}/contacts`, contactListSchema, { signal });
}

export function getContactsQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: noticesKeys.contacts(reservoirId),
    queryFn: ({ signal }) => getContacts(reservoirId, signal),
  });
}

export function useContacts(reservoirId: string) {
  return useQuery(getContactsQueryOptions(reservoirId));
}
