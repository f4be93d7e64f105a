import type { GatedSpillway, LowLevelOutlet } from '../schema.js';

/** Structures for the discharge tests: a one-gate spillway on a 200 m crest, the demo's outlet. */
export const testGate = (id: string, width = 12, cg = 0.68) => ({
  id,
  channel: `${id}.opening`,
  type: 'radial' as const,
  width,
  maxOpening: 9,
  orificeCoefficient: cg,
  travelSpeed: 0.005,
});
export const testSpillway = (c = 2.1, cg = 0.68): GatedSpillway => ({
  id: 'spill',
  name: 'Spillway',
  kind: 'gated-spillway',
  crestElevation: 200,
  coefficient: c,
  gates: [testGate('g1', 12, cg)],
});
export const testOutlet = (over: Partial<LowLevelOutlet> = {}): LowLevelOutlet => ({
  id: 'llo',
  name: 'Outlet',
  kind: 'low-level-outlet',
  valveChannel: 'outlet.valve',
  diameter: 1.8,
  length: 60,
  outletElevation: 173,
  frictionFactor: 0.015,
  entranceLossCoefficient: 0.5,
  valveLossCoefficient: 0.2,
  travelSpeed: 0.5,
  ...over,
});
