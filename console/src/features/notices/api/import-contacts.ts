import { useMutation, useQueryClient } from '@tanstack/react-query';
import { importResultSchema, type ImportResult } from '@stillwell/shared/notices';
import { apiPost } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function importContacts(reservoirId: string, csv: string): Promise<ImportResult> {
  return apiPost(
    `/api/reservoirs/${enc(reservoirId)}/contacts/import`,
    { csv },
    importResultSchema,
  );
}

export function useImportContacts(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (csv: string) => importContacts(reservoirId, csv),
    onSuccess: async (result) => {
      if (result.imported === 0) return;
      await queryClient.invalidateQueries({ queryKey: noticesKeys.contacts(reservoirId) });
      await queryClient.invalidateQueries({ queryKey: noticesKeys.zones(reservoirId) });
    },
  });
}
