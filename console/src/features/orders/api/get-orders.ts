import { queryOptions, useQuery } from '@tanstack/react-query';
import { orderListSchema, type Order } from '@stillwell/shared/orders';
import { apiGet } from '../../../lib/api-client';
import { ordersKeys } from './keys';

const base = (reservoirId: string) => `/api/reservoirs/${encodeURIComponent(reservoirId)}/orders`;

export function getOrders(reservoirId: string, signal?: AbortSignal): Promise<Order[]> {
  return apiGet(base(reservoirId), orderListSchema, { signal, query: { limit: '100' } });
}

export function getOrdersQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: ordersKeys.list(reservoirId),
    queryFn: ({ signal }) => getOrders(reservoirId, signal),
    // kept current by the orders room; refetched on every (re)subscribe
    staleTime: Infinity,
  });
}

export function useOrders(reservoirId: string) {
  return useQuery(getOrdersQueryOptions(reservoirId));
}

/** Emergency actions still awaiting a duty engineer's countersignature. */
export function getAwaitingCountersign(
  reservoirId: string,
  signal?: AbortSignal,
): Promise<Order[]> {
  return apiGet(base(reservoirId), orderListSchema, {
    signal,
    query: { awaitingCountersign: 'true', limit: '500' },
  });
}

export function getAwaitingCountersignQueryOptions(reservoirId: string) {
  return queryOptions({
    queryKey: ordersKeys.countersign(reservoirId),
    queryFn: ({ signal }) => getAwaitingCountersign(reservoirId, signal),
    staleTime: Infinity,
  });
}

export function useAwaitingCountersign(reservoirId: string) {
  return useQuery(getAwaitingCountersignQueryOptions(reservoirId));
}
