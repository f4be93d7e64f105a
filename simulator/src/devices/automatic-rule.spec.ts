import { describe, expect, it } from 'vitest';
import type { Actuator, PlantState } from '../plant/reservoir-plant.js';
import { AutomaticRules, type RuleEvent } from './automatic-rule.js';

const actuators: Actuator[] = [
  { id: 'gate-3', kind: 'gate', channel: 'gate.3.opening', max: 9, travelSpeed: 0.005 },
  { id: 'low-level-outlet', kind: 'valve', channel: 'outlet.valve', max: 100, travelSpeed: 0.5 },
];
const at = (pool: number, timeMs = 0) => ({ pool, timeMs }) as PlantState;

function rules(set: object) {
  const events: RuleEvent[] = [];
  const r = new AutomaticRules(actuators, (e) => events.push(e));
  r.apply(JSON.stringify(set), 0);
  return { r, events };
}

describe('automatic rules', () => {
  it('fires once at the level, re-arms below the band, and fires again', () => {
    const { r, events } = rules({
      revision: 1,
      rules: [{ control: 'low-level-outlet', enabled: true, riseAbove: 208, target: 60 }],
    });
    expect(r.evaluate(at(207.99))).toBeNull();
    expect(r.evaluate(at(208))).toEqual({ gates: {}, valves: { 'low-level-outlet': 60 } });
    expect(r.evaluate(at(208.5))).toBeNull();
    expect(r.evaluate(at(207.95))).toBeNull(); // inside the band: still disarmed
    expect(r.evaluate(at(207.85))).toBeNull();
    expect(r.evaluate(at(208.01))).not.toBeNull();
    expect(events.map((e) => e.kind)).toEqual(['applied', 'triggered', 'rearmed', 'triggered']);
  });

  it('does nothing while switched off, and keeps an unchanged rule disarmed when the set is re-sent', () => {
    const set = {
      revision: 2,
      rules: [{ control: 'gate-3', enabled: true, riseAbove: 208, target: 3 }],
    };
    const { r } = rules(set);
    expect(r.evaluate(at(209))).not.toBeNull();
    r.apply(JSON.stringify(set), 0);
    expect(r.evaluate(at(209))).toBeNull();
    r.apply(JSON.stringify({ revision: 3, rules: [{ ...set.rules[0], enabled: false }] }), 0);
    expect(r.evaluate(at(210))).toBeNull();
  });

  it('refuses an older revision than the one in force', () => {
    const { r, events } = rules({ revision: 5, rules: [] });
    expect(r.apply(JSON.stringify({ revision: 4, rules: [] }), 0)).toBe(false);
    expect(events.at(-1)).toMatchObject({ kind: 'rejected', revision: 4 });
    expect(r.current.revision).toBe(5);
  });
});
