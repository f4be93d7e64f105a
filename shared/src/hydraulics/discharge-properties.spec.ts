import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Structure } from './schema.js';
import { structureDischarge, type OutletSettings } from './discharge.js';
import { testOutlet, testSpillway } from './testing/structures.js';

// Random structures for the monotonicity and continuity properties.
const arbStructure: fc.Arbitrary<Structure> = fc.oneof(
  fc
    .record({
      c: fc.double({ min: 1, max: 2.5, noNaN: true }),
      l: fc.double({ min: 1, max: 200, noNaN: true }),
    })
    .map(({ c, l }): Structure => ({
      id: 'o',
      name: 'o',
      kind: 'ogee-crest',
      crestElevation: 100,
      effectiveLength: l,
      coefficient: c,
    })),
  fc
    .record({
      c: fc.double({ min: 1.3, max: 2.5, noNaN: true }),
      cg: fc.double({ min: 0.4, max: 0.9, noNaN: true }),
    })
    .map(({ c, cg }): Structure => ({ ...testSpillway(c, cg), crestElevation: 100 })),
  fc
    .record({
      d: fc.double({ min: 0.2, max: 3, noNaN: true }),
      k: fc.double({ min: 0, max: 2, noNaN: true }),
    })
    .map(({ d, k }): Structure =>
      testOutlet({ diameter: d, valveLossCoefficient: k, outletElevation: 95, id: 'llo' }),
    ),
);
const settingsOf = (o: number): OutletSettings => ({
  gates: { g1: o },
  valves: { llo: (o / 9) * 100 },
});

describe('properties: continuous and non-decreasing in pool and opening', () => {
  it('non-decreasing in pool elevation', () => {
    fc.assert(
      fc.property(
        arbStructure,
        fc.double({ min: 90, max: 115, noNaN: true }),
        fc.double({ min: 0, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 9, noNaN: true }),
        fc.option(fc.double({ min: 90, max: 112, noNaN: true }), { nil: undefined }),
        (s, h, dh, o, tw) => {
          const a = structureDischarge(s, h, settingsOf(o), tw);
          const b = structureDischarge(s, h + dh, settingsOf(o), tw);
          expect(b).toBeGreaterThanOrEqual(a);
        },
      ),
      { numRuns: 2000 },
    );
  });
  it('non-decreasing in each opening', () => {
    fc.assert(
      fc.property(
        arbStructure,
        fc.double({ min: 90, max: 115, noNaN: true }),
        fc.double({ min: 0, max: 9, noNaN: true }),
        fc.double({ min: 0, max: 9, noNaN: true }),
        (s, h, o1, o2) => {
          const [lo, hi] = o1 < o2 ? [o1, o2] : [o2, o1];
          expect(structureDischarge(s, h, settingsOf(hi))).toBeGreaterThanOrEqual(
            structureDischarge(s, h, settingsOf(lo)),
          );
        },
      ),
      { numRuns: 2000 },
    );
  });
  it('continuous in pool and opening (small change in, small change out), including at regime boundaries', () => {
    const eps = 1e-9;
    fc.assert(
      fc.property(
        arbStructure,
        fc.double({ min: 0, max: 9, noNaN: true }),
        fc.constantFrom(0, 1, 2, 3),
        fc.double({ min: -2, max: 12, noNaN: true }),
        (s, o, mode, x) => {
          // mode 0: random pool; 1: pool at the gate lip; 2: pool at the crest; 3: pool at the opening centre
          const h = mode === 0 ? 100 + x : mode === 1 ? 100 + o : mode === 2 ? 100 : 100 + o / 2;
          const q = structureDischarge(s, h, settingsOf(o));
          const scale = 1e-3 * (1 + q);
          expect(Math.abs(structureDischarge(s, h + eps, settingsOf(o)) - q)).toBeLessThan(scale);
          expect(Math.abs(structureDischarge(s, h - eps, settingsOf(o)) - q)).toBeLessThan(scale);
          expect(Math.abs(structureDischarge(s, h, settingsOf(o + eps)) - q)).toBeLessThan(scale);
        },
      ),
      { numRuns: 2000 },
    );
  });
});
