import {
  RULE_REARM_BAND_M,
  ruleSetMessageSchema,
  type RuleEventMessage,
  type RuleSetting,
} from '@stillwell/shared/orders';
import { describeIssues } from '@stillwell/shared/telemetry';
import type { Actuator, PlantState, Settings } from '../plant/reservoir-plant.js';

export interface LiveRule extends RuleSetting {
  /** fires when the pool is at or above its level; disarmed after firing until the pool falls back */
  armed: boolean;
}

export type RuleEvent = Omit<RuleEventMessage, 'eventId'>;

/**
 * The controller's automatic rules: open a gate or the outlet valve to a set target when the pool
 * reaches a set elevation. They run in the field device, not in the gateway, so that they still act
 * when the gateway or its link is down. A rule fires once; it arms again when the pool has fallen
 * RULE_REARM_BAND_M below its level. A rule switched on while the pool is already above its level
 * fires at the next step: switching it on says the level has been passed.
 */
export class AutomaticRules {
  private revision = -1;
  private rules: LiveRule[] = [];

  constructor(
    private readonly actuators: readonly Actuator[],
    private readonly emit: (event: RuleEvent) => void,
  ) {}

  get current(): { revision: number; rules: readonly Readonly<LiveRule>[] } {
    return { revision: this.revision, rules: this.rules };
  }

  /**
   * Takes a whole rule set (the retained message). A bad set is refused whole and the rules in
   * force stay, so a typo cannot switch the protection off.
   */
  apply(payload: string, timeMs: number): boolean {
    const time = new Date(timeMs).toISOString();
    let json: unknown;
    try {
      json = JSON.parse(payload);
    } catch {
      this.emit({ kind: 'rejected', revision: 0, reason: 'rule set is not JSON', time });
      return false;
    }
    const parsed = ruleSetMessageSchema.safeParse(json);
    const revision = (json as { revision?: unknown })?.revision;
    const named =
      typeof revision === 'number' && Number.isInteger(revision) && revision >= 0 ? revision : 0;
    if (!parsed.success) {
      this.emit({ kind: 'rejected', revision: named, reason: describeIssues(parsed.error), time });
      return false;
    }
    const set = parsed.data;
    for (const r of set.rules) {
      const a = this.actuators.find((x) => x.id === r.control);
      const reason = !a
        ? `no gate or valve "${r.control}" on this controller`
        : r.target > a.max
          ? `${r.control}: target ${r.target} is outside 0..${a.max}`
          : null;
      if (reason) {
        this.emit({ kind: 'rejected', revision: set.revision, control: r.control, reason, time });
        return false;
      }
    }
    if (set.revision < this.revision) {
      this.emit({
        kind: 'rejected',
        revision: set.revision,
        reason: `revision ${set.revision} is older than ${this.revision} in force`,
        time,
      });
      return false;
    }
    const before = new Map(this.rules.map((r) => [r.control, r]));
    this.rules = set.rules.map((r) => {
      const old = before.get(r.control);
      // an unchanged rule keeps its armed state, so re-sending the set does not fire it again
      const same =
        old &&
        old.enabled === r.enabled &&
        old.riseAbove === r.riseAbove &&
        old.target === r.target;
      return { ...r, armed: same ? old.armed : true };
    });
    this.revision = set.revision;
    this.emit({ kind: 'applied', revision: set.revision, time });
    return true;
  }

  /** Evaluates the rules against the plant's pool; returns the targets to set, if any fired. */
  evaluate(state: Readonly<PlantState>): Partial<Settings> | null {
    let change: Settings | null = null;
    const time = new Date(state.timeMs).toISOString();
    for (const rule of this.rules) {
      if (!rule.enabled) continue;
      if (rule.armed && state.pool >= rule.riseAbove) {
        rule.armed = false;
        const a = this.actuators.find((x) => x.id === rule.control)!;
        change ??= { gates: {}, valves: {} };
        (a.kind === 'gate' ? change.gates : change.valves)[a.id] = rule.target;
        this.emit({
          kind: 'triggered',
          revision: this.revision,
          control: rule.control,
          pool: state.pool,
          target: rule.target,
          time,
        });
      } else if (!rule.armed && state.pool < rule.riseAbove - RULE_REARM_BAND_M) {
        rule.armed = true;
        this.emit({
          kind: 'rearmed',
          revision: this.revision,
          control: rule.control,
          pool: state.pool,
          time,
        });
      }
    }
    return change;
  }
}
