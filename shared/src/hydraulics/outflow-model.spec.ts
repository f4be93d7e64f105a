import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEMO_RESERVOIR } from '../reservoirs/demo.js';
import { totalOutflow } from './discharge.js';
import { gateBayFlow, gateBayRegime } from './formulas.js';
import { compileOutflow } from './outflow-model.js';
import type { Structure } from './schema.js';

const rating: Structure = {
  id: 'fuse-plug',
  name: 'Fuse plug (rated)',
  kind: 'rating-table',
  rows: [
    { elevation: 210, discharge: 0 },
    { elevation: 211, discharge: 40 },
    { elevation: 213, discharge: 400 },
  ],
};
const structures: Structure[] = [...DEMO_RESERVOIR.structures, rating];
const model = compileOutflow(structures);

describe('compiled outflow model', () => {
  it('equals totalOutflow (the public per-structure functions) everywhere', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 170, max: 218, noNaN: true }),
        fc.array(fc.double({ min: -1, max: 12, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.double({ min: -5, max: 110, noNaN: true }),
        fc.option(fc.double({ min: 165, max: 215, noNaN: true }), { nil: undefined }),
        (h, g, v, tw) => {
          const settings = {
            gates: { 'gate-1': g[0]!, 'gate-2': g[1]!, 'gate-3': g[2]! },
            valves: { 'low-level-outlet': v },
          };
          const expected = totalOutflow(structures, h, settings, tw);
          const got = model.outflow(h, model.openingsOf(settings), tw ?? NaN);
          expect(Math.abs(got - expected)).toBeLessThanOrEqual(1e-9 * (1 + expected));
        },
      ),
      { numRuns: 3000 },
    );
  });
  it('maps settings to openings and back, clamping to the ranges', () => {
    const op = model.openingsOf({
      gates: { 'gate-1': 12, 'gate-3': -1 },
      valves: { 'low-level-outlet': 55 },
    });
    expect(Array.from(op)).toEqual([9, 0, 0, 55]);
    expect(model.settingsOf(op)).toEqual({
      gates: { 'gate-1': 9, 'gate-2': 0, 'gate-3': 0 },
      valves: { 'low-level-outlet': 55 },
    });
    expect(model.indexOf('gate-3')).toBe(2);
    expect(model.indexOf('nope')).toBe(-1);
  });
  it('rejects duplicate gate ids', () => {
    expect(() =>
      compileOutflow([...DEMO_RESERVOIR.structures, DEMO_RESERVOIR.structures[0]!]),
    ).toThrow('duplicate gate/valve id "gate-1"');
  });
});

describe('gate bay regimes (free flow and submerged paths agree)', () => {
  it('the free-flow fast path equals the general path with a tailwater just below the crest', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1.3, max: 2.5, noNaN: true }),
        fc.double({ min: 0.4, max: 0.9, noNaN: true }),
        fc.double({ min: 0, max: 15, noNaN: true }),
        fc.double({ min: 0, max: 12, noNaN: true }),
        (c, cg, head, g) => {
          // a tiny positive tail head forces the general path; its Villemonte factor is 1 - O(1e-18)
          const free = gateBayFlow(c, cg, 10, head, g);
          const general = gateBayFlow(c, cg, 10, head, g, 1e-12);
          expect(Math.abs(free - general)).toBeLessThanOrEqual(1e-6 * (1 + free));
        },
      ),
      { numRuns: 3000 },
    );
  });
  it('names the regime', () => {
    expect(gateBayRegime(2.1, 0.68, 12, 7, 0)).toBe('closed');
    expect(gateBayRegime(2.1, 0.68, 12, -1, 2)).toBe('dry');
    expect(gateBayRegime(2.1, 0.68, 12, 7, 9)).toBe('weir');
    expect(gateBayRegime(2.1, 0.68, 12, 7, 1)).toBe('orifice');
    // with a low gate coefficient the weir flow at the lip bridges the gap just above the lip
    expect(gateBayRegime(2.1, 0.5, 12, 4.2, 4)).toBe('lip-weir');
  });
});
