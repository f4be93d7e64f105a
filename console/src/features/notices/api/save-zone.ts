import { useMutation, useQueryClient } from '@tanstack/react-query';
import { zoneSchema, type Zone, type ZoneInput } from '@stillwell/shared/notices';
import { apiPost, apiPut } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function saveZone(reservoirId: string, id: string | null, input: ZoneInput): Promise<Zone> {
  const base = `/api/reservoirs/${enc(reservoirId)}/zones`;
  return id ? apiPut(`${base}/${enc(id)}`, input, zoneSchema) : apiPost(base, input, zoneSchema);
}

export function useSaveZone(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string | null; input: ZoneInput }) =>
      saveZone(reservoirId, id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: noticesKeys.zones(reservoirId) }),
  });
}
