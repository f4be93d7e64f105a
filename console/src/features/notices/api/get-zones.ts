import { queryOptions, useQuery } from '@tanstack/react-query';
import { zoneListSchema, type Zone } from '@stillwell/shared/notices';
import { apiGet } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

export function getZones(reservoirId: string, signal?: AbortSignal): Promise<Zone[]> {
  return apiGet(`/api/reservoirs/${enc(reservoirId)}/zones`, zoneListSchema, { signal });
}

export function getZonesQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: noticesKeys.zones(reservoirId),
    queryFn: ({ signal }) => getZones(reservoirId, signal),
  });
}

export function useZones(reservoirId: string) {
  return useQuery(getZonesQueryOptions(reservoirId));
}
