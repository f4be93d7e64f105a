import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { describeIssues } from '../telemetry/message.js';
import { createOrderRequestSchema, type Emergency, type Order } from './api.js';
import { controlsOf } from './controls.js';
import { orderImpact } from './impact.js';
import { interlockReport, refusalsOf } from './interlocks.js';
import { releaseRamp } from './release.js';
import {
  checkStepsAgainst,
  countersignRefusal,
  executeRefusal,
  reviewRefusal,
  withdrawRefusal,
} from './rules.js';
import { canMove, isFinal, ORDER_STATES, ORDER_TRANSITIONS } from './states.js';

const NOW = Date.UTC(2030, 0, 1, 12);
const iso = (ms: number) => new Date(ms).toISOString();
const mara = { userId: 'u-op', username: 'operator' };
const tobin = { userId: 'u-eng', username: 'engineer' };

function order(overrides: Partial<Order> = {}): Order {
  return {
    id: 7,
    reservoirId: 'lake-orrin',
    state: 'proposed',
    emergency: false,
    emergencyId: null,
    steps: [{ offsetMin: 0, targets: [{ control: 'gate-1', target: 2 }] }],
    reason: 'draw down ahead of the storm',
    plannedStart: iso(NOW),
    author: mara,
    createdAt: iso(NOW),
    forecast: null,
    impact: null,
    decision: null,
    authorisedUntil: null,
    execution: null,
    currentStep: null,
    nextStepDue: null,
    commands: [],
    fault: null,
    awaitingCountersign: false,
    countersign: null,
    withdrawal: null,
    updatedAt: iso(NOW),
    ...overrides,
  };
}

const emergency: Emergency = {
  id: 1,
  reservoirId: 'lake-orrin',
  level: 2,
  reason: 'flood above forecast',
  declaredBy: tobin,
  declaredAt: iso(NOW),
  ended: null,
};

describe('order states', () => {
  it('lets final states go nowhere and every target be a known state', () => {
    for (const s of ORDER_STATES)
      for (const t of ORDER_TRANSITIONS[s]) expect(ORDER_STATES).toContain(t);
    expect(isFinal('declined')).toBe(true);
    expect(isFinal('in-position')).toBe(true);
    expect(canMove('declined', 'dispatched')).toBe(false);
    expect(canMove('lapsed', 'dispatched')).toBe(false);
    expect(canMove('authorised', 'dispatched')).toBe(true);
  });
});

describe('the two-person rule', () => {
  it('refuses the author as reviewer and accepts anyone else', () => {
    expect(reviewRefusal(order(), mara)).toMatchObject({ code: 'own-order' });
    expect(reviewRefusal(order(), tobin)).toBeNull();
    expect(reviewRefusal(order({ state: 'authorised' }), tobin)).toMatchObject({
      code: 'wrong-state',
    });
  });

  it('executes an authorised order only before its authorisation runs out', () => {
    const authorised = order({ state: 'authorised', authorisedUntil: iso(NOW + 30 * 60_000) });
    expect(executeRefusal(authorised, null, NOW)).toBeNull();
    expect(executeRefusal(authorised, null, NOW + 30 * 60_000)).toMatchObject({
      code: 'authorisation-lapsed',
    });
  });

  it('refuses a declined order, naming who declined it and why', () => {
    const declined = order({
      state: 'declined',
      decision: { outcome: 'declined', by: tobin, at: iso(NOW), comment: 'wait for the forecast' },
    });
    const refusal = executeRefusal(declined, emergency, NOW);
    expect(refusal?.code).toBe('wrong-state');
    expect(refusal?.message).toMatch(/declined by engineer: "wait for the forecast"/);
  });

  it('executes a proposed order only under a declared emergency that has not ended', () => {
    expect(executeRefusal(order(), null, NOW)).toMatchObject({ code: 'not-authorised' });
    expect(executeRefusal(order(), emergency, NOW)).toBeNull();
    const ended = { ...emergency, ended: { by: tobin, at: iso(NOW), comment: 'over' } };
    expect(executeRefusal(order(), ended, NOW)).toMatchObject({ code: 'not-authorised' });
  });

  it('countersigns only emergency actions, never by someone who took part', () => {
    const done = order({
      state: 'in-position',
      emergency: true,
      awaitingCountersign: true,
      execution: { by: mara, at: iso(NOW), waived: [], clearance: '' },
    });
    expect(countersignRefusal(done, mara)).toMatchObject({ code: 'countersign-self' });
    expect(countersignRefusal(done, tobin)).toBeNull();
    expect(countersignRefusal(order(), tobin)).toMatchObject({ code: 'countersign-not-needed' });
  });

  it('withdraws before execution or between steps only', () => {
    expect(withdrawRefusal(order())).toBeNull();
    expect(withdrawRefusal(order({ state: 'holding' }))).toBeNull();
    expect(withdrawRefusal(order({ state: 'travelling' }))).toMatchObject({ code: 'wrong-state' });
  });
});

describe('draft requests', () => {
  it('names the field of every problem', () => {
    const parsed = createOrderRequestSchema.safeParse({
      reason: 'x',
      steps: [
        { offsetMin: 5, targets: [{ control: 'gate-1', target: -1 }] },
        { offsetMin: 5, targets: [] },
      ],
    });
    expect(parsed.success).toBe(false);
    const text = describeIssues(parsed.error!);
    expect(text).toMatch(/reason: at least 5 characters/);
    expect(text).toMatch(/steps\.0\.targets\.0\.target: an opening cannot be negative/);
    expect(text).toMatch(/steps\.1\.targets: name at least one gate or valve/);
    expect(text).toMatch(/steps\.0\.offsetMin: the first step starts at execution/);
    expect(text).toMatch(/steps\.1\.offsetMin: each step must come after/);
  });

  it('checks targets against the reservoir', () => {
    const problems = checkStepsAgainst(DEMO_RESERVOIR, [
      {
        offsetMin: 0,
        targets: [
          { control: 'gate-1', target: 9.5 },
          { control: 'gate-9', target: 1 },
          { control: 'low-level-outlet', target: 40 },
        ],
      },
    ]);
    expect(problems).toEqual([
      {
        path: 'steps.0.targets.0.target',
        message: expect.stringMatching(/9\.5 m is outside its limits 0\.\.9 m/),
      },
      {
        path: 'steps.0.targets.1.control',
        message: expect.stringMatching(/no gate or valve "gate-9"/),
      },
    ]);
  });
});

describe('release and routed effect', () => {
  const controls = controlsOf(DEMO_RESERVOIR);
  const closed = { 'gate-1': 0, 'gate-2': 0, 'gate-3': 0, 'low-level-outlet': 10 };

  it('finds three gates opening together three times as steep as one', () => {
    const one = releaseRamp(DEMO_RESERVOIR, controls, 205, closed, { 'gate-1': 9 });
    const three = releaseRamp(DEMO_RESERVOIR, controls, 205, closed, {
      'gate-1': 9,
      'gate-2': 9,
      'gate-3': 9,
    });
    expect(one.travelS).toBeCloseTo(1800, 6);
    expect(one.to).toBeGreaterThan(one.from);
    expect(three.steepestPerMin / one.steepestPerMin).toBeCloseTo(3, 1);
  });

  it('lowers the forecast peak when gates open under a steady inflow', () => {
    const impact = orderImpact({
      definition: DEMO_RESERVOIR,
      pool: 206,
      openings: closed,
      inflow: 900,
      steps: [
        {
          offsetMin: 0,
          targets: [
            { control: 'gate-1', target: 6 },
            { control: 'gate-2', target: 6 },
          ],
        },
      ],
      horizonH: 12,
    });
    expect(impact.releaseChange).toBeGreaterThan(100);
    expect(impact.peakWith!.elevation).toBeLessThan(impact.peakWithout!.elevation);
    expect(impact.basis).toMatch(/held at its present 900 m3\/s/);
  });

  it('says so when there is no inflow to route', () => {
    const impact = orderImpact({
      definition: DEMO_RESERVOIR,
      pool: 206,
      openings: closed,
      inflow: null,
      steps: [{ offsetMin: 0, targets: [{ control: 'gate-1', target: 1 }] }],
    });
    expect(impact.peakWith).toBeNull();
    expect(impact.basis).toMatch(/cannot be computed/);
  });
});

describe('interlock reports', () => {
  const outcomes = [
    { code: 'release-rate' as const, ok: false, message: 'too steep' },
    { code: 'telemetry-stale' as const, ok: true, message: 'fresh' },
  ];
  it('refuses on a failed check, except one an emergency waives', () => {
    expect(interlockReport(outcomes, false, iso(NOW)).ok).toBe(false);
    const waived = interlockReport(outcomes, true, iso(NOW));
    expect(waived.ok).toBe(true);
    expect(waived.results[0]).toMatchObject({ waived: true });
    const stale = interlockReport(
      [{ code: 'telemetry-stale', ok: false, message: 'old' }],
      true,
      iso(NOW),
    );
    expect(refusalsOf(stale).map((r) => r.code)).toEqual(['telemetry-stale']);
  });
});

describe('automatic rule topics', () => {
  it('spells and reads the rules and rule-events topics', async () => {
    const { parseRuleTopic, ruleEventsTopic, rulesTopic, RULE_EVENTS_SUBSCRIPTION } =
      await import('./automation.js');
    expect(rulesTopic('lake-orrin', 'gate-controller')).toBe(
      'stillwell/v1/lake-orrin/rules/gate-controller',
    );
    expect(parseRuleTopic(ruleEventsTopic('lake-orrin', 'gate-controller'))).toEqual({
      kind: 'rule-events',
      reservoirId: 'lake-orrin',
      deviceId: 'gate-controller',
    });
    expect(parseRuleTopic('stillwell/v1/lake-orrin/telemetry/gate-controller')).toBeNull();
    expect(parseRuleTopic('stillwell/v1/Lake/rules/x')).toBeNull();
    expect(RULE_EVENTS_SUBSCRIPTION).toBe('stillwell/v1/+/rule-events/+');
    expect(() => rulesTopic('lake-orrin', 'a/b')).toThrow(/not a valid topic segment/);
  });
});
