import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Structure, StorageRow } from './schema.js';
import { latestStart } from './decisions/time-left.js';
import { routeStorageIndication } from './route.js';
import { routeDormandPrince } from './route-rk.js';
import type { RoutingOptions } from './routing-types.js';
import { createStorageCurve } from './storage-curve.js';

// Random reservoirs: A(z) = A0 ((z - z0) / D)^p + Amin with the storage its exact integral, a gated
// spillway (one or two gates) on a crest 20-35 m up, an optional ogee crest and a low-level outlet.
const H = 3600;
const DT = 300;
const arbTable = fc
  .record({
    a0: fc.double({ min: 2e5, max: 5e6, noNaN: true }),
    p: fc.double({ min: 0, max: 2, noNaN: true }),
    amin: fc.double({ min: 1e3, max: 1e5, noNaN: true }),
  })
  .map(({ a0, p, amin }): StorageRow[] => {
    const rows: StorageRow[] = [];
    for (let z = 0; z <= 60; z += 2) {
      rows.push({
        elevation: 100 + z,
        area: a0 * (z / 40) ** p + amin,
        storage: (a0 * 40 * (z / 40) ** (p + 1)) / (p + 1) + amin * z,
      });
    }
    return rows;
  });
const arbStructures = fc
  .record({
    crest: fc.double({ min: 120, max: 135, noNaN: true }),
    widths: fc.array(fc.double({ min: 3, max: 15, noNaN: true }), { minLength: 1, maxLength: 2 }),
    c: fc.double({ min: 1.6, max: 2.2, noNaN: true }),
    cg: fc.double({ min: 0.55, max: 0.75, noNaN: true }),
    ogee: fc.option(fc.double({ min: 5, max: 50, noNaN: true }), { nil: undefined }),
    d: fc.double({ min: 0.5, max: 2.5, noNaN: true }),
  })
  .map(({ crest, widths, c, cg, ogee, d }): Structure[] => [
    {
      id: 'spill',
      name: 'Spillway',
      kind: 'gated-spillway',
      crestElevation: crest,
      coefficient: c,
      gates: widths.map((width, i) => ({
        id: `g${i + 1}`,
        channel: `g${i + 1}.opening`,
        type: 'radial',
        width,
        maxOpening: 10,
        orificeCoefficient: cg,
        travelSpeed: 0.005,
      })),
    },
    ...(ogee === undefined
      ? []
      : [
          {
            id: 'ogee',
            name: 'Ogee',
            kind: 'ogee-crest' as const,
            crestElevation: crest + 8,
            effectiveLength: ogee,
            coefficient: 2.1,
          },
        ]),
    {
      id: 'llo',
      name: 'Outlet',
      kind: 'low-level-outlet',
      valveChannel: 'llo.valve',
      diameter: d,
      length: 50,
      outletElevation: 102,
      frictionFactor: 0.015,
      entranceLossCoefficient: 0.5,
      valveLossCoefficient: 0.3,
      travelSpeed: 0.5,
    },
  ]);
// Inflow hydrographs with knots on the step grid (so the mass balance tests the solver, not sampling).
const arbInflow = fc
  .array(fc.double({ min: 0, max: 1500, noNaN: true }), { minLength: 2, maxLength: 10 })
  .map((qs) => ({ t: qs.map((_, i) => i * 4 * DT), q: qs }));
const arbCase = fc.record({
  table: arbTable,
  structures: arbStructures,
  inflow: arbInflow,
  start: fc.double({ min: 110, max: 135, noNaN: true }),
});
const make = (c: {
  table: StorageRow[];
  structures: Structure[];
  inflow: { t: number[]; q: number[] };
  start: number;
}): RoutingOptions => ({
  storage: createStorageCurve(c.table),
  structures: c.structures,
  inflow: c.inflow,
  initialElevation: c.start,
  duration: 24 * H,
  dt: DT,
  aboveTable: 'stop',
});
const gatesOf = (s: Structure[]) =>
  s[0]!.kind === 'gated-spillway' ? s[0]!.gates.map((g) => g.id) : [];

describe('properties over random reservoirs and inflows', () => {
  it('mass balance closes (storage indication and Dormand-Prince)', () => {
    fc.assert(
      fc.property(arbCase, fc.double({ min: 0, max: 10, noNaN: true }), (c, x) => {
        const o = {
          ...make(c),
          initialSettings: {
            gates: Object.fromEntries(gatesOf(c.structures).map((g) => [g, x])),
            valves: { llo: 50 },
          },
        };
        const si = routeStorageIndication(o);
        fc.pre(si.leftTableAt === null);
        expect(Math.abs(si.massBalance.relativeError)).toBeLessThan(1e-8);
        const rk = routeDormandPrince(o);
        expect(Math.abs(rk.massBalance.relativeError)).toBeLessThan(1e-8);
        expect(Math.abs(rk.peakElevation - si.peakElevation)).toBeLessThan(0.05);
      }),
      { numRuns: 40 },
    );
  });
  it('a larger gate opening never raises the peak', () => {
    fc.assert(
      fc.property(
        arbCase,
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        fc.integer({ min: 0, max: 20 }),
        (c, x1, x2, hour) => {
          const [lo, hi] = x1 < x2 ? [x1, x2] : [x2, x1];
          const o = make(c);
          const at = (x: number) =>
            routeStorageIndication({
              ...o,
              schedule: gatesOf(c.structures).map((id) => ({ time: hour * H, id, target: x })),
            }).peakElevation;
          expect(at(hi)).toBeLessThanOrEqual(at(lo) + 1e-9);
        },
      ),
      { numRuns: 60 },
    );
  });
  it('zero inflow with an open outlet never raises the pool', () => {
    fc.assert(
      fc.property(arbCase, fc.double({ min: 1, max: 100, noNaN: true }), (c, valve) => {
        const r = routeStorageIndication({
          ...make(c),
          inflow: { t: [0], q: [0] },
          initialSettings: { gates: {}, valves: { llo: valve } },
        });
        // (to the level solver's tolerance, 1e-10 m: near the outlet, where the flow stops, the level
        // settles and round-off remains)
        let rise = 0;
        for (let i = 1; i < r.elevation.length; i++)
          rise = Math.max(rise, r.elevation[i]! - r.elevation[i - 1]!);
        expect(rise).toBeLessThanOrEqual(1e-9);
        expect(r.elevation[r.elevation.length - 1]).toBeLessThan(r.elevation[0]!);
      }),
      { numRuns: 60 },
    );
  });
  it('the "time left to act" plan started then keeps the peak at or below the target; a step later does not', () => {
    fc.assert(
      fc.property(arbCase, fc.double({ min: 0.2, max: 3, noNaN: true }), (c, margin) => {
        const o = make(c);
        const plan = gatesOf(c.structures).map((id) => ({ time: 0, id, target: 10 }));
        const shut = routeStorageIndication(o).peakElevation;
        const target = shut - margin;
        const r = latestStart(o, { plan, target });
        const peakFrom = (start: number) =>
          routeStorageIndication({ ...o, schedule: plan.map((e) => ({ ...e, time: start })) })
            .peakElevation;
        if (r.status === 'ok') {
          expect(peakFrom(r.latestStart!)).toBeLessThanOrEqual(target);
          if (r.latestStart! + DT <= o.duration)
            expect(peakFrom(r.latestStart! + DT)).toBeGreaterThan(target);
        } else {
          expect(r.status).toBe('impossible');
          expect(peakFrom(0)).toBeGreaterThan(target);
        }
      }),
      { numRuns: 40 },
    );
  });
});
