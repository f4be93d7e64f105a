/**
 * Turns a condition judged again and again into clean raise and clear events.
 *
 * - on-delay: the condition must hold, continuously, for `onDelayMs` of site time before the alarm
 *   is raised, so a single spike or a few noisy readings over a limit do not annunciate;
 * - deadband: once raised, the alarm clears only when the value is back past the limit by the
 *   deadband (the caller judges 'reset' against limit - deadband), so noise at the limit cannot
 *   make it chatter;
 * - off-delay (where given): the alarm clears only once the condition has been over for that long,
 *   for conditions judged from runs that can flip from one to the next (the forecast);
 * - 'unknown' (no usable value) neither raises nor clears: data trouble has alarms of its own.
 */
export type Verdict = 'set' | 'deadband' | 'reset' | 'unknown';

export type Transition = 'raise' | 'clear';

/** Judges a value against a high limit (or a low one) with a deadband. */
export function limitVerdict(
  value: number | null,
  limit: number,
  deadband: number,
  direction: 'high' | 'low' = 'high',
): Verdict {
  if (value === null || !Number.isFinite(value)) return 'unknown';
  if (direction === 'high') {
    if (value > limit) return 'set';
    return value < limit - deadband ? 'reset' : 'deadband';
  }
  if (value < limit) return 'set';
  return value > limit + deadband ? 'reset' : 'deadband';
}

export class Debouncer {
  private on = false;
  private pendingSince: number | null = null;
  private clearingSince: number | null = null;

  constructor(
    private readonly onDelayMs: number,
    active = false,
    private readonly offDelayMs = 0,
  ) {
    this.on = active;
  }

  get active(): boolean {
    return this.on;
  }

  /** The alarm was raised or cleared from outside (restored state, an external source). */
  force(active: boolean): void {
    this.on = active;
    this.pendingSince = null;
    this.clearingSince = null;
  }

  update(verdict: Verdict, nowMs: number): Transition | null {
    if (!this.on) {
      if (verdict === 'set') {
        this.pendingSince ??= nowMs;
        if (nowMs - this.pendingSince >= this.onDelayMs) {
          this.on = true;
          this.pendingSince = null;
          return 'raise';
        }
      } else if (verdict !== 'unknown') {
        // the condition broke off: the on-delay starts again next time
        this.pendingSince = null;
      }
      return null;
    }
    if (verdict === 'reset') {
      this.clearingSince ??= nowMs;
      if (nowMs - this.clearingSince >= this.offDelayMs) {
        this.on = false;
        this.clearingSince = null;
        return 'clear';
      }
    } else if (verdict !== 'unknown') {
      this.clearingSince = null;
    }
    return null;
  }
}
