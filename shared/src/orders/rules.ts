import type { ReservoirDefinition } from '../reservoirs/definition.js';
import type { Emergency, Order, OrderErrorCode, OrderStep } from './api.js';
import { controlsOf } from './controls.js';
import { ORDER_STATE_LABELS } from './states.js';

/**
 * The two-person rule and the order lifecycle as pure checks. The gateway enforces them; the
 * console calls the same functions only to explain why a button is not offered.
 */
export interface Refusal {
  code: OrderErrorCode;
  message: string;
}

export interface Actor {
  userId: string;
}

const label = (o: Pick<Order, 'id'>) => `Order ${o.id}`;

function wrongState(order: Order, wanted: string): Refusal {
  const extra =
    order.state === 'declined' && order.decision
      ? ` (declined by ${order.decision.by.username}: "${order.decision.comment}")`
      : '';
  return {
    code: 'wrong-state',
    message: `${label(order)} is ${ORDER_STATE_LABELS[order.state].toLowerCase()}${extra}; only an order ${wanted} can be acted on here`,
  };
}

/** Authorising or declining: a proposed order, by someone other than its author. */
export function reviewRefusal(order: Order, actor: Actor): Refusal | null {
  if (order.state !== 'proposed') return wrongState(order, 'awaiting review');
  if (order.author.userId === actor.userId) {
    return {
      code: 'own-order',
      message: `You drafted ${label(order)}: another duty engineer must review it (two-person rule)`,
    };
  }
  return null;
}

/** Whether an authorisation has run out at this site time. */
export function hasLapsed(order: Pick<Order, 'authorisedUntil'>, siteNowMs: number): boolean {
  return order.authorisedUntil !== null && Date.parse(order.authorisedUntil) <= siteNowMs;
}

/**
 * Executing: an authorised order before its authorisation runs out, or, under a declared
 * emergency only, a proposed one (flagged, to be countersigned afterwards).
 */
export function executeRefusal(
  order: Order,
  emergency: Emergency | null,
  siteNowMs: number,
): Refusal | null {
  if (order.state === 'authorised') {
    if (hasLapsed(order, siteNowMs)) {
      return {
        code: 'authorisation-lapsed',
        message: `The authorisation of ${label(order)} ran out at ${order.authorisedUntil}; draft it again for a fresh review`,
      };
    }
    return null;
  }
  if (order.state === 'proposed') {
    if (emergency && emergency.ended === null) return null;
    return {
      code: 'not-authorised',
      message: `${label(order)} has not been authorised by a duty engineer; without a declared emergency it cannot be executed`,
    };
  }
  return wrongState(order, 'authorised');
}

/** Countersigning an emergency order afterwards: by an engineer who neither drafted nor ran it. */
export function countersignRefusal(order: Order, actor: Actor): Refusal | null {
  if (!order.awaitingCountersign) {
    return {
      code: 'countersign-not-needed',
      message: `${label(order)} is not an emergency action awaiting countersignature`,
    };
  }
  if (order.author.userId === actor.userId || order.execution?.by.userId === actor.userId) {
    return {
      code: 'countersign-self',
      message: `You took part in ${label(order)}: another duty engineer must countersign it`,
    };
  }
  return null;
}

/** Withdrawing: before execution, or between the steps of a schedule. */
export function withdrawRefusal(order: Order): Refusal | null {
  if (order.state === 'proposed' || order.state === 'authorised' || order.state === 'holding')
    return null;
  return wrongState(order, 'awaiting review, authorised or holding between steps');
}

/**
 * Problems of a schedule against the reservoir: unknown gates and targets outside their travel.
 * Paths are as in the request ("steps.0.targets.1.target").
 */
export function checkStepsAgainst(
  definition: ReservoirDefinition,
  steps: readonly OrderStep[],
): Array<{ path: string; message: string }> {
  const controls = controlsOf(definition);
  const out: Array<{ path: string; message: string }> = [];
  steps.forEach((step, i) =>
    step.targets.forEach((t, j) => {
      const c = controls.find((x) => x.id === t.control);
      if (!c) {
        out.push({
          path: `steps.${i}.targets.${j}.control`,
          message: `no gate or valve "${t.control}"; known: ${controls.map((x) => x.id).join(', ')}`,
        });
      } else if (t.target > c.max) {
        out.push({
          path: `steps.${i}.targets.${j}.target`,
          message: `${c.label}: ${t.target} ${c.unit} is outside its limits 0..${c.max} ${c.unit}`,
        });
      }
    }),
  );
  return out;
}
