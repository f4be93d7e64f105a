import { z } from 'zod';

/**
 * The life of a gate operation order. Names are Stillwell's own.
 *   proposed    drafted by an operator, waiting for a duty engineer's review
 *   authorised  a duty engineer (not the author) authorised it; runs out after a set time
 *   declined    a duty engineer declined it (final)
 *   lapsed      the authorisation ran out before it was executed (final)
 *   withdrawn   taken back by an operator before or between its moves (final)
 *   dispatched  a step's command is on its way; waiting for the controller's acknowledgement
 *   travelling  acknowledged; the gates are moving and telemetry is watched
 *   holding     a step is in position; the next step of the schedule is not due yet
 *   in-position every step confirmed by telemetry within tolerance (final)
 *   faulted     no acknowledgement, a refusal, a position that did not follow, or an
 *               interlock that stopped a later step (final; see the fault)
 */
export const ORDER_STATES = [
  'proposed',
  'authorised',
  'declined',
  'lapsed',
  'withdrawn',
  'dispatched',
  'travelling',
  'holding',
  'in-position',
  'faulted',
] as const;
export const orderStateSchema = z.enum(ORDER_STATES);
export type OrderState = z.infer<typeof orderStateSchema>;

/** Every allowed move between states; the gateway refuses any other. */
export const ORDER_TRANSITIONS: Readonly<Record<OrderState, readonly OrderState[]>> = {
  // proposed -> dispatched only under a declared emergency (flagged, countersigned afterwards)
  proposed: ['authorised', 'declined', 'withdrawn', 'dispatched'],
  authorised: ['dispatched', 'lapsed', 'withdrawn'],
  declined: [],
  lapsed: [],
  withdrawn: [],
  dispatched: ['travelling', 'faulted'],
  travelling: ['holding', 'in-position', 'faulted'],
  holding: ['dispatched', 'withdrawn', 'faulted'],
  'in-position': [],
  faulted: [],
};

export function canMove(from: OrderState, to: OrderState): boolean {
  return ORDER_TRANSITIONS[from].includes(to);
}

export function isFinal(state: OrderState): boolean {
  return ORDER_TRANSITIONS[state].length === 0;
}

/** States in which an order is driving gates (so another order may not move the same ones). */
export const ACTIVE_STATES: readonly OrderState[] = ['dispatched', 'travelling', 'holding'];

/** What the console calls each state. */
export const ORDER_STATE_LABELS: Readonly<Record<OrderState, string>> = {
  proposed: 'Awaiting review',
  authorised: 'Authorised',
  declined: 'Declined',
  lapsed: 'Authorisation lapsed',
  withdrawn: 'Withdrawn',
  dispatched: 'Command sent',
  travelling: 'Gates travelling',
  holding: 'Holding for next step',
  'in-position': 'In position',
  faulted: 'Fault',
};

/** Why an order faulted. */
export const FAULT_CODES = [
  'ack-missing',
  'command-rejected',
  'not-following',
  'publish-failed',
  'interlock',
] as const;
export const faultCodeSchema = z.enum(FAULT_CODES);
export type FaultCode = z.infer<typeof faultCodeSchema>;
