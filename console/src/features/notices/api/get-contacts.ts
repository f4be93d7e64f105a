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

/** `enabled` false for someone who may not see the contact list (it is the liaison's). */
export function useContacts(reservoirId: string, enabled = true) {
  return useQuery({ ...getContactsQueryOptions(reservoirId), enabled });
}
