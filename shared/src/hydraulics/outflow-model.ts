import type { Structure } from './schema.js';
import type { OutletSettings } from './discharge.js';
import { conduitFactor, gateBayFlow, weirFlow } from './formulas.js';
import { STANDARD_GRAVITY } from '../units/units.js';
import { compileRating, type CompiledRating } from './rating-table.js';

/** An operable gate or valve. Openings are m for gates and % for valves. */
export interface Control {
  id: string;
  kind: 'gate' | 'valve';
  structureId: string;
  /** largest opening: gate maxOpening (m) or 100 (%) */
  max: number;
  /** travel speed: m/s for gates, %/s for valves */
  speed: number;
}

/**
 * The outflow structures compiled for tight loops: openings live in a Float64Array indexed like
 * `controls`, tailwater is a number (NaN for none). The same formula functions as
 * structureDischarge, called from monomorphic loops over flat parameter arrays (tested equal).
 */
export interface OutflowModel {
  readonly structures: readonly Structure[];
  readonly controls: readonly Control[];
  /** control index of a gate id or low-level-outlet id, -1 if none */
  indexOf(id: string): number;
  /** total outflow, m3/s */
  outflow(pool: number, openings: Float64Array, tailwater: number): number;
  openingsOf(settings: OutletSettings): Float64Array;
  settingsOf(openings: Float64Array): OutletSettings;
}

export function compileOutflow(structures: readonly Structure[]): OutflowModel {
  const controls: Control[] = [];
  const index = new Map<string, number>();
  const addControl = (c: Control) => {
    if (index.has(c.id)) throw new Error(`duplicate gate/valve id "${c.id}"`);
    index.set(c.id, controls.length);
    controls.push(c);
    return controls.length - 1;
  };
  const weirs: number[][] = []; // [crest, coefficient, length]
  const bays: number[][] = []; // [crest, C, Cg, width, max, control]
  const outlets: number[][] = []; // [outlet z, D, L, f, Ke, Kv, control]
  const ratings: CompiledRating[] = [];
  for (const s of structures) {
    switch (s.kind) {
      case 'ogee-crest':
        weirs.push([s.crestElevation, s.coefficient, s.effectiveLength]);
        break;
      case 'broad-crested-weir':
        weirs.push([s.crestElevation, s.coefficient, s.length]);
        break;
      case 'gated-spillway':
        for (const g of s.gates) {
          const k = addControl({
            id: g.id,
            kind: 'gate',
            structureId: s.id,
            max: g.maxOpening,
            speed: g.travelSpeed,
          });
          bays.push([
            s.crestElevation,
            s.coefficient,
            g.orificeCoefficient,
            g.width,
            g.maxOpening,
            k,
          ]);
        }
        break;
      case 'low-level-outlet': {
        const k = addControl({
          id: s.id,
          kind: 'valve',
          structureId: s.id,
          max: 100,
          speed: s.travelSpeed,
        });
        outlets.push([
          s.outletElevation,
          s.diameter,
          s.length,
          s.frictionFactor,
          s.entranceLossCoefficient,
          s.valveLossCoefficient,
          k,
        ]);
        break;
      }
      case 'rating-table':
        ratings.push(compileRating(s));
        break;
    }
  }
  const col = (rows: number[][], j: number) => Float64Array.from(rows, (r) => r[j]!);
  const idx = (rows: number[][], j: number) => Int32Array.from(rows, (r) => r[j]!);
  const nw = weirs.length;
  const wz = col(weirs, 0);
  const wc = col(weirs, 1);
  const wl = col(weirs, 2);
  const ng = bays.length;
  const gz = col(bays, 0);
  const gc = col(bays, 1);
  const gcg = col(bays, 2);
  const gb = col(bays, 3);
  const gmax = col(bays, 4);
  const gk = idx(bays, 5);
  // bays identical to the one before (same crest, coefficients, width, maximum): when they are also
  // open by the same amount their flow is the same, so it is computed once (gates usually come in
  // identical sets and are often moved together)
  const sameAsPrev = Uint8Array.from(bays, (r, i) =>
    i > 0 && r.slice(0, 5).every((v, j) => v === bays[i - 1]![j]) ? 1 : 0,
  );
  const no = outlets.length;
  const oz = col(outlets, 0);
  const ok = idx(outlets, 6);
  const nr = ratings.length;
  // per outlet: the valve opening the cached factor a / sqrt(1 + K) belongs to
  const lastPct = new Float64Array(no).fill(NaN);
  const factor = new Float64Array(no);
  const TWO_G = 2 * STANDARD_GRAVITY;
  const outletFactor = (i: number, pct: number) => {
    const r = outlets[i]!;
    lastPct[i] = pct;
    factor[i] = conduitFactor(r[1]!, r[2]!, r[3]!, r[4]!, r[5]!, pct);
  };

  return {
    structures,
    controls,
    indexOf: (id) => index.get(id) ?? -1,
    outflow(h, op, tw) {
      let q = 0;
      for (let i = 0; i < nw; i++) {
        const z = wz[i]!;
        q += weirFlow(wc[i]!, wl[i]!, h - z, tw > z ? tw - z : 0);
      }
      let prevOpening = NaN;
      let prevQ = 0;
      for (let i = 0; i < ng; i++) {
        const z = gz[i]!;
        const max = gmax[i]!;
        const x = op[gk[i]!]!;
        const opening = x > 0 ? (x < max ? x : max) : 0;
        if (sameAsPrev[i] !== 1 || opening !== prevOpening) {
          prevQ = gateBayFlow(gc[i]!, gcg[i]!, gb[i]!, h - z, opening, tw > z ? tw - z : 0);
          prevOpening = opening;
        }
        q += prevQ;
      }
      for (let i = 0; i < no; i++) {
        const z = oz[i]!;
        const x = op[ok[i]!]!;
        const pct = x > 0 ? (x < 100 ? x : 100) : 0;
        if (pct !== lastPct[i]) outletFactor(i, pct);
        const head = h - (tw > z ? tw : z);
        if (head > 0) q += factor[i]! * Math.sqrt(TWO_G * head);
      }
      for (let i = 0; i < nr; i++) q += ratings[i]!.at(h);
      return q;
    },
    openingsOf(settings) {
      return Float64Array.from(controls, (c) => {
        const v = (c.kind === 'gate' ? settings.gates[c.id] : settings.valves[c.id]) ?? 0;
        return v > 0 ? Math.min(v, c.max) : 0;
      });
    },
    settingsOf(op) {
      const out: OutletSettings = { gates: {}, valves: {} };
      controls.forEach((c, i) => {
        if (c.kind === 'gate') out.gates[c.id] = op[i]!;
        else out.valves[c.id] = op[i]!;
      });
      return out;
    },
  };
}
