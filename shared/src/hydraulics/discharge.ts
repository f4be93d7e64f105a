import type { Structure } from './schema.js';
import { conduitFlow, gateBayFlow, gateBayRegime, weirFlow, type GateRegime } from './formulas.js';
import { compileRating } from './rating-table.js';

/**
 * Positions of the operable outlets. A gate or valve missing from the record is taken as closed;
 * gate openings are clamped to 0..maxOpening, valve openings to 0..100 %.
 */
export type OutletSettings = {
  /** gate id -> opening, m above the sill */
  gates: Record<string, number>;
  /** low-level-outlet structure id -> valve opening, % */
  valves: Record<string, number>;
};

export const CLOSED: OutletSettings = Object.freeze({
  gates: Object.freeze({}),
  valves: Object.freeze({}),
});

/** Tailwater head over a crest (0 when there is no tailwater or it is below the crest). */
function tailHead(tailwater: number | undefined, crest: number): number {
  return tailwater !== undefined && tailwater > crest ? tailwater - crest : 0;
}

const clamp = (v: number | undefined, max: number) =>
  v === undefined || !(v > 0) ? 0 : v > max ? max : v;

/** Discharge, m3/s, of one structure at a pool elevation (m) with the given outlet settings. */
export function structureDischarge(
  structure: Structure,
  poolElevation: number,
  settings: OutletSettings,
  tailwater?: number,
): number {
  switch (structure.kind) {
    case 'ogee-crest':
      return weirFlow(
        structure.coefficient,
        structure.effectiveLength,
        poolElevation - structure.crestElevation,
        tailHead(tailwater, structure.crestElevation),
      );
    case 'broad-crested-weir':
      return weirFlow(
        structure.coefficient,
        structure.length,
        poolElevation - structure.crestElevation,
        tailHead(tailwater, structure.crestElevation),
      );
    case 'gated-spillway': {
      let q = 0;
      for (const g of structure.gates)
        q += gateDischarge(structure, g, poolElevation, settings, tailwater);
      return q;
    }
    case 'low-level-outlet': {
      const downstream =
        tailwater !== undefined && tailwater > structure.outletElevation
          ? tailwater
          : structure.outletElevation;
      return conduitFlow(
        structure.diameter,
        structure.length,
        structure.frictionFactor,
        structure.entranceLossCoefficient,
        structure.valveLossCoefficient,
        clamp(settings.valves[structure.id], 100),
        poolElevation - downstream,
      );
    }
    case 'rating-table':
      return compileRating(structure).at(poolElevation);
  }
}

function gateDischarge(
  spillway: Extract<Structure, { kind: 'gated-spillway' }>,
  g: Extract<Structure, { kind: 'gated-spillway' }>['gates'][number],
  poolElevation: number,
  settings: OutletSettings,
  tailwater: number | undefined,
): number {
  return gateBayFlow(
    spillway.coefficient,
    g.orificeCoefficient,
    g.width,
    poolElevation - spillway.crestElevation,
    clamp(settings.gates[g.id], g.maxOpening),
    tailHead(tailwater, spillway.crestElevation),
  );
}

/** Total discharge, m3/s, of all structures. */
export function totalOutflow(
  structures: readonly Structure[],
  poolElevation: number,
  settings: OutletSettings,
  tailwater?: number,
): number {
  let q = 0;
  for (const s of structures) q += structureDischarge(s, poolElevation, settings, tailwater);
  return q;
}

export interface GateFlow {
  id: string;
  /** opening used, m (after clamping) */
  opening: number;
  discharge: number;
  regime: GateRegime;
}

export interface StructureFlow {
  id: string;
  name: string;
  kind: Structure['kind'];
  discharge: number;
  /** per gate, for a gated spillway */
  gates?: GateFlow[];
  /** valve opening used, %, for a low-level outlet */
  valveOpening?: number;
  /** true when a rating table was extended above its last row */
  extrapolated?: boolean;
}

export interface DischargeBreakdown {
  poolElevation: number;
  total: number;
  structures: StructureFlow[];
}

/** Flow through each structure (and each gate) at a pool elevation. */
export function dischargeBreakdown(
  structures: readonly Structure[],
  poolElevation: number,
  settings: OutletSettings,
  tailwater?: number,
): DischargeBreakdown {
  const out: StructureFlow[] = structures.map((s) => {
    const base = { id: s.id, name: s.name, kind: s.kind };
    const discharge = structureDischarge(s, poolElevation, settings, tailwater);
    if (s.kind === 'gated-spillway') {
      const th = tailHead(tailwater, s.crestElevation);
      const head = poolElevation - s.crestElevation;
      const gates = s.gates.map((g) => {
        const opening = clamp(settings.gates[g.id], g.maxOpening);
        return {
          id: g.id,
          opening,
          discharge: gateBayFlow(s.coefficient, g.orificeCoefficient, g.width, head, opening, th),
          regime: gateBayRegime(s.coefficient, g.orificeCoefficient, g.width, head, opening, th),
        };
      });
      return { ...base, discharge, gates };
    }
    if (s.kind === 'low-level-outlet')
      return { ...base, discharge, valveOpening: clamp(settings.valves[s.id], 100) };
    if (s.kind === 'rating-table') {
      return { ...base, discharge, extrapolated: poolElevation > compileRating(s).maxElevation };
    }
    return { ...base, discharge };
  });
  return { poolElevation, total: out.reduce((a, s) => a + s.discharge, 0), structures: out };
}
