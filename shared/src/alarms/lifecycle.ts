import { z } from 'zod';

/**
 * An alarm's state after the ISA-18.2 (IEC 62682) state model: the process condition is active or
 * cleared, the operator has acknowledged it or not, and the alarm is in service, shelved (hidden
 * for a while, with a reason and an expiry) or out of service (taken away for maintenance, with a
 * reason). Alarms do not latch: a cleared alarm nobody acknowledged stays in the list until it is.
 */
export const HANDLINGS = ['in-service', 'shelved', 'out-of-service'] as const;
export type Handling = (typeof HANDLINGS)[number];

export const alarmStateSchema = z.strictObject({
  active: z.boolean(),
  acknowledged: z.boolean(),
  handling: z.enum(HANDLINGS),
  /** site time the shelf ends, epoch ms (shelved only) */
  shelvedUntilMs: z.number().nullable(),
  /** why it was shelved or taken out of service */
  reason: z.string().nullable(),
});
export type AlarmState = z.infer<typeof alarmStateSchema>;

/** The state of an alarm that has never been raised. */
export const NORMAL: AlarmState = Object.freeze({
  active: false,
  acknowledged: true,
  handling: 'in-service',
  shelvedUntilMs: null,
  reason: null,
});

/** The state as one word for lists, after ISA-18.2's names. */
export const DISPLAY_STATES = [
  'unacknowledged',
  'acknowledged',
  'cleared-unacknowledged',
  'normal',
  'shelved',
  'out-of-service',
] as const;
export type DisplayState = (typeof DISPLAY_STATES)[number];

export function displayState(s: AlarmState): DisplayState {
  if (s.handling === 'shelved') return 'shelved';
  if (s.handling === 'out-of-service') return 'out-of-service';
  if (s.active) return s.acknowledged ? 'acknowledged' : 'unacknowledged';
  return s.acknowledged ? 'normal' : 'cleared-unacknowledged';
}

/** Something a person asks of an alarm. */
export type AlarmAction =
  | { type: 'acknowledge'; comment?: string }
  | { type: 'shelve'; reason: string; untilMs: number }
  | { type: 'remove-from-service'; reason: string }
  | { type: 'return-to-service'; comment?: string };

/** Why an action was refused: stable codes the API and the console act on. */
export const REFUSALS = [
  'already-acknowledged',
  'not-in-service',
  'reason-required',
  'expiry-not-in-future',
  'expiry-too-far',
  'already-in-service',
] as const;
export type Refusal = (typeof REFUSALS)[number];

export type ActionResult =
  { ok: true; state: AlarmState } | { ok: false; refusal: Refusal; message: string };

export interface ActionContext {
  /** site time, epoch ms */
  nowMs: number;
  /** the longest shelf allowed, ms */
  shelveMaxMs: number;
}

/** The shortest reason accepted: a word or two, so "x" does not pass for one. */
export const MIN_REASON_LENGTH = 4;

const refuse = (refusal: Refusal, message: string): ActionResult => ({
  ok: false,
  refusal,
  message,
});

/** Applies a person's action, or says why it cannot be done; never changes `s`. */
export function applyAction(s: AlarmState, action: AlarmAction, ctx: ActionContext): ActionResult {
  switch (action.type) {
    case 'acknowledge':
      if (s.handling !== 'in-service')
        return refuse('not-in-service', `the alarm is ${s.handling}: nothing to acknowledge`);
      if (s.acknowledged)
        return refuse('already-acknowledged', 'the alarm is already acknowledged');
      return { ok: true, state: { ...s, acknowledged: true } };
    case 'shelve': {
      if (s.handling !== 'in-service')
        return refuse('not-in-service', `the alarm is ${s.handling} already`);
      const reason = checkReason(action.reason);
      if (!reason.ok) return reason.result;
      if (!(action.untilMs > ctx.nowMs))
        return refuse('expiry-not-in-future', 'a shelf must end in the future');
      if (action.untilMs - ctx.nowMs > ctx.shelveMaxMs)
        return refuse(
          'expiry-too-far',
          `an alarm may be shelved for at most ${Math.round(ctx.shelveMaxMs / 60_000)} minutes`,
        );
      return {
        ok: true,
        state: { ...s, handling: 'shelved', shelvedUntilMs: action.untilMs, reason: reason.text },
      };
    }
    case 'remove-from-service': {
      if (s.handling === 'out-of-service')
        return refuse('not-in-service', 'the alarm is out of service already');
      const reason = checkReason(action.reason);
      if (!reason.ok) return reason.result;
      return {
        ok: true,
        state: { ...s, handling: 'out-of-service', shelvedUntilMs: null, reason: reason.text },
      };
    }
    case 'return-to-service':
      if (s.handling === 'in-service')
        return refuse('already-in-service', 'the alarm is in service already');
      return { ok: true, state: returned(s) };
  }
}

function checkReason(
  raw: string,
): { ok: true; text: string } | { ok: false; result: ActionResult } {
  const text = (raw ?? '').trim();
  if (text.length < MIN_REASON_LENGTH)
    return {
      ok: false,
      result: refuse(
        'reason-required',
        `a reason of at least ${MIN_REASON_LENGTH} characters is required`,
      ),
    };
  return { ok: true, text };
}

/**
 * Back in service: an alarm whose condition is still active is presented afresh, unacknowledged,
 * because the operator has not seen it while it was away; a cleared one returns to normal.
 */
function returned(s: AlarmState): AlarmState {
  return {
    active: s.active,
    acknowledged: !s.active,
    handling: 'in-service',
    shelvedUntilMs: null,
    reason: null,
  };
}

/**
 * The condition changed. `annunciated` is true when the operator is to be told (a new alarm in
 * service): only those count in the alarm rate. A shelved or out-of-service alarm follows its
 * condition silently.
 */
export function applyCondition(
  s: AlarmState,
  change: 'raise' | 'clear',
): { state: AlarmState; annunciated: boolean } {
  if (change === 'raise') {
    if (s.active) return { state: s, annunciated: false };
    if (s.handling !== 'in-service') return { state: { ...s, active: true }, annunciated: false };
    return { state: { ...s, active: true, acknowledged: false }, annunciated: true };
  }
  // Clearing leaves the acknowledgement as it was: an unseen alarm stays to be seen.
  return { state: s.active ? { ...s, active: false } : s, annunciated: false };
}

/** A shelf that has run out (site time) returns the alarm to service; null when nothing changes. */
export function expireShelf(s: AlarmState, nowMs: number): AlarmState | null {
  if (s.handling !== 'shelved' || s.shelvedUntilMs === null || nowMs < s.shelvedUntilMs)
    return null;
  return returned(s);
}

/** Whether the alarm belongs in the operator's list: anything not at rest. */
export function isListed(s: AlarmState): boolean {
  return displayState(s) !== 'normal';
}
