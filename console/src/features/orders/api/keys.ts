/** Query keys of the orders feature, spelled once. */
export const ordersKeys = {
  all: (reservoirId: string) => ['orders', reservoirId] as const,
  list: (reservoirId: string) => ['orders', reservoirId, 'list'] as const,
  countersign: (reservoirId: string) => ['orders', reservoirId, 'countersign'] as const,
  detail: (orderId: number) => ['orders', 'detail', orderId] as const,
  interlocks: (orderId: number) => ['orders', 'detail', orderId, 'interlocks'] as const,
  emergency: (reservoirId: string) => ['orders', reservoirId, 'emergency'] as const,
  automation: (reservoirId: string) => ['orders', reservoirId, 'automation'] as const,
  // not under ['orders', id]: refetching the orders must not empty the alarms pushed so far
  alarms: (reservoirId: string) => ['order-alarms', reservoirId] as const,
  me: () => ['auth', 'me'] as const,
};
