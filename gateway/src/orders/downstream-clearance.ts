import type { Order } from '@stillwell/shared/orders';

/**
 * Whether downstream has been told enough for this release: the required notices sent and their
 * lead time run. The notices module supplies the real check by providing this token; the orders
 * module only asks. `reason` is shown to the operator as it is, so it must say what to do.
 */
export const DOWNSTREAM_CLEARANCE = Symbol('DOWNSTREAM_CLEARANCE');

export type ClearanceResult = { ok: true; note: string } | { ok: false; reason: string };

export interface DownstreamClearance {
  check(order: Order, step: number): ClearanceResult | Promise<ClearanceResult>;
}
