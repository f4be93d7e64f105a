import { useMutation, useQueryClient } from '@tanstack/react-query';
import { contactSchema, type Contact, type ContactInput } from '@stillwell/shared/notices';
import { apiPost, apiPut } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function saveContact(
  reservoirId: string,
  id: string | null,
  input: ContactInput,
): Promise<Contact> {
  const base = `/api/reservoirs/${enc(reservoirId)}/contacts`;
  return id
    ? apiPut(`${base}/${enc(id)}`, input, contactSchema)
    : apiPost(base, input, contactSchema);
}

export function useSaveContact(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string | null; input: ContactInput }) =>
      saveContact(reservoirId, id, input),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: noticesKeys.contacts(reservoirId) });
      await queryClient.invalidateQueries({ queryKey: noticesKeys.zones(reservoirId) });
    },
  });
}
