import { queryOptions, useQuery } from '@tanstack/react-query';
import {
  interlockReportSchema,
  orderSchema,
  type InterlockReport,
  type Order,
} from '@stillwell/shared/orders';
import { apiGet } from '../../../lib/api-client';
import { ordersKeys } from './keys';

export function getOrder(orderId: number, signal?: AbortSignal): Promise<Order> {
  return apiGet(`/api/orders/${orderId}`, orderSchema, { signal });
}

export function getOrderQueryOptions(orderId: number) {
  return queryOptions({
    queryKey: ordersKeys.detail(orderId),
    queryFn: ({ signal }) => getOrder(orderId, signal),
    staleTime: Infinity,
  });
}

export function useOrder(orderId: number | null) {
  return useQuery({ ...getOrderQueryOptions(orderId ?? 0), enabled: orderId !== null });
}

/** The interlocks of the order's next step as they stand now: asked for, never cached long. */
export function getInterlocks(orderId: number, signal?: AbortSignal): Promise<InterlockReport> {
  return apiGet(`/api/orders/${orderId}/interlocks`, interlockReportSchema, { signal });
}

export function useInterlocks(orderId: number | null, enabled: boolean) {
  return useQuery({
    queryKey: ordersKeys.interlocks(orderId ?? 0),
    queryFn: ({ signal }) => getInterlocks(orderId!, signal),
    enabled: orderId !== null && enabled,
    staleTime: 0,
  });
}
