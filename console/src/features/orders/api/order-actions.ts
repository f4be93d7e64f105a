import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { orderSchema, type CreateOrderRequest, type Order } from '@stillwell/shared/orders';
import { apiPost } from '../../../lib/api-client';
import { ordersKeys } from './keys';

/** Every change the gateway answers with the order as it now stands: put it in the cache. */
export function rememberOrder(queryClient: QueryClient, order: Order): void {
  queryClient.setQueryData(ordersKeys.detail(order.id), order);
  queryClient.setQueryData<Order[]>(ordersKeys.list(order.reservoirId), (old) => {
    if (!old) return old;
    const i = old.findIndex((o) => o.id === order.id);
    if (i < 0) return [order, ...old];
    // a push that raced the answer must not wind the order back
    if (old[i]!.updatedAt > order.updatedAt) return old;
    return old.map((o) => (o.id === order.id ? order : o));
  });
  void queryClient.invalidateQueries({ queryKey: ordersKeys.countersign(order.reservoirId) });
}

export function createOrder(reservoirId: string, body: CreateOrderRequest): Promise<Order> {
  return apiPost(`/api/reservoirs/${encodeURIComponent(reservoirId)}/orders`, body, orderSchema);
}

export type OrderAction = 'authorise' | 'decline' | 'execute' | 'withdraw' | 'countersign';

export function actOnOrder(orderId: number, action: OrderAction, comment?: string): Promise<Order> {
  return apiPost(
    `/api/orders/${orderId}/${action}`,
    action === 'execute' ? {} : { comment },
    orderSchema,
  );
}

export function useCreateOrder(reservoirId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateOrderRequest) => createOrder(reservoirId, body),
    onSuccess: (order) => rememberOrder(queryClient, order),
  });
}

export function useOrderAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (v: { orderId: number; action: OrderAction; comment?: string }) =>
      actOnOrder(v.orderId, v.action, v.comment),
    onSuccess: (order) => rememberOrder(queryClient, order),
  });
}
