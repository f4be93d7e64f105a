import type { Order } from '@stillwell/shared/orders';
import type { ReleaseOrderFacts } from '@stillwell/shared/notices';

/**
 * What the notices need to know of a gate order: the release its last step leaves (the order's
 * routed impact), the release before it, and when it means to start. Null when the order has no
 * impact figures (no fresh pool reading when it was drafted): then nobody can say who is affected.
 */
export function factsOf(order: Order): ReleaseOrderFacts | null {
  if (!order.impact) return null;
  return {
    orderId: String(order.id),
    reservoirId: order.reservoirId,
    targetReleaseM3s: order.impact.expectedRelease,
    currentReleaseM3s: order.impact.currentRelease,
    plannedStartAt: Date.parse(order.plannedStart),
    durationS: null,
    emergency: order.emergency,
  };
}
