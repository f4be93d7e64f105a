import type { OrderTimeline } from '@stillwell/shared/reports';

export interface OrderFacts {
  id: number;
  state: string;
  emergency: boolean;
  reason: string;
}

/** A logbook entry about an order: kind, its site time, who (null for the gateway) and its seq. */
export interface OrderEntry {
  orderId: number;
  kind: string;
  t: number;
  actor: string | null;
  seq: number;
}

/** The logbook kind that confirms every step of an order in position (by telemetry). */
export const CONFIRMED_KIND = 'order.in-position';
export const DRAFTED_KIND = 'order.drafted';

/** Each order's steps from its logbook entries, in chain order, with the time between them. */
export function orderTimelines(
  orders: readonly OrderFacts[],
  entries: readonly OrderEntry[],
): OrderTimeline[] {
  return orders.map((o) => {
    const mine = entries.filter((e) => e.orderId === o.id).sort((a, b) => a.seq - b.seq);
    const steps = mine.map((e, i) => ({
      kind: e.kind,
      t: e.t,
      actor: e.actor,
      sincePrevious: i === 0 ? null : e.t - mine[i - 1]!.t,
      logbookSeq: e.seq,
    }));
    const drafted = mine.find((e) => e.kind === DRAFTED_KIND);
    const confirmed = mine.find((e) => e.kind === CONFIRMED_KIND);
    return {
      orderId: o.id,
      state: o.state,
      emergency: o.emergency,
      reason: o.reason,
      steps,
      draftToConfirmation: drafted && confirmed ? confirmed.t - drafted.t : null,
    };
  });
}
