import { STANDARD_GRAVITY } from '../units/units.js';

/**
 * Discharge formulas for single hydraulic elements, SI throughout (m, m3/s, g = 9.80665 m/s2).
 * Every function is continuous and non-decreasing in the upstream head and in the opening, and
 * non-increasing in the tailwater head; heads at or below zero give zero (no reverse flow).
 */

const TWO_G = 2 * STANDARD_GRAVITY;

/**
 * Villemonte's submergence factor for weir flow (Villemonte, "Submerged-weir discharge studies",
 * Engineering News-Record 139, 1947): Qs / Qfree = (1 - (H2/H1)^1.5)^0.385, with H1 the upstream and
 * H2 the downstream head over the crest. 1 when the tailwater is below the crest.
 */
export function villemonteFactor(head: number, tailHead: number): number {
  if (!(tailHead > 0)) return 1;
  if (tailHead >= head) return 0;
  const r = tailHead / head;
  return Math.pow(1 - r * Math.sqrt(r), 0.385);
}

/** Weir: Q = C L H^1.5 (C in m^0.5/s), reduced by Villemonte's factor for tailwater over the crest. */
export function weirFlow(coefficient: number, length: number, head: number, tailHead = 0): number {
  if (!(head > 0)) return 0;
  return coefficient * length * head * Math.sqrt(head) * villemonteFactor(head, tailHead);
}

/** Flow regime of one gate bay, for display. */
export type GateRegime = 'closed' | 'dry' | 'weir' | 'orifice' | 'lip-weir';

/**
 * One gated bay on a spillway crest. head = pool - crest, opening G = gate lip above the crest.
 *
 * - gate closed (G <= 0) or pool at or below the crest: 0;
 * - gate clear of the water (G >= head): free weir flow Qw = C B H^1.5;
 * - pool above the lip: orifice flow Qo = Cg G B sqrt(2 g Hc), Hc the head on the centre of the
 *   opening (head - G/2), or on the tailwater when that is above the centre (submerged);
 * - transition: Q = min(Qw, max(Qo, Qlip)), Qlip = C B G^1.5 being the weir flow with the pool at
 *   the lip. The gate controls only when it passes less than the free crest would; Qlip bridges the
 *   gap for coefficients where Qo at the lip falls below Qw (Cg sqrt(g) < C), so Q is continuous at
 *   G = head and non-decreasing in head and in G for any coefficients (min/max of non-decreasing
 *   functions; Qo rises with G for G < head).
 */
export function gateBayFlow(
  weirCoefficient: number,
  gateCoefficient: number,
  width: number,
  head: number,
  opening: number,
  tailHead = 0,
): number {
  if (!(opening > 0) || !(head > 0)) return 0;
  if (opening >= head) return weirFlow(weirCoefficient, width, head, tailHead);
  if (!(tailHead > 0)) {
    // free flow: pick the regime by comparing squares, then take a single square root
    const hc = head - opening / 2;
    const cg2 = gateCoefficient * gateCoefficient * TWO_G;
    const c2 = weirCoefficient * weirCoefficient;
    const qo2 = cg2 * opening * opening * hc; // (Qo / B)^2
    if (qo2 >= c2 * head * head * head) return weirCoefficient * width * head * Math.sqrt(head);
    if (qo2 > c2 * opening * opening * opening)
      return gateCoefficient * opening * width * Math.sqrt(TWO_G * hc);
    return weirCoefficient * width * opening * Math.sqrt(opening);
  }
  const qw = weirFlow(weirCoefficient, width, head, tailHead);
  const hc = head - Math.max(opening / 2, tailHead);
  const qo = hc > 0 ? gateCoefficient * opening * width * Math.sqrt(TWO_G * hc) : 0;
  if (qo >= qw) return qw;
  const qlip = weirFlow(weirCoefficient, width, opening, tailHead); // < qw, as opening < head
  return qo > qlip ? qo : qlip;
}

/** The regime gateBayFlow used, for the breakdown shown to operators. */
export function gateBayRegime(
  weirCoefficient: number,
  gateCoefficient: number,
  width: number,
  head: number,
  opening: number,
  tailHead = 0,
): GateRegime {
  if (!(opening > 0)) return 'closed';
  if (!(head > 0)) return 'dry';
  if (opening >= head) return 'weir';
  const qw = weirFlow(weirCoefficient, width, head, tailHead);
  const hc = head - Math.max(opening / 2, tailHead);
  const qo = hc > 0 ? gateCoefficient * opening * width * Math.sqrt(TWO_G * hc) : 0;
  const qlip = weirFlow(weirCoefficient, width, opening, tailHead);
  if (Math.max(qo, qlip) >= qw) return 'weir';
  return qo >= qlip ? 'orifice' : 'lip-weir';
}

/** Contraction coefficient of the valve's partly open port (sharp-edged orifice value). */
export const VALVE_CONTRACTION = 0.62;

/**
 * Valve loss law, fraction x = opening / 100 of a linear-area valve (sleeve, slide or gate type):
 * the partly open port is a sharp-edged orifice of area x a with contraction Cc = 0.62, and the jet
 * expanding back to the full bore loses (1 / (Cc x) - 1)^2 velocity heads (Borda-Carnot). The
 * fully-open coefficient Kv100 replaces that law's value at x = 1:
 *   Kv(x) = Kv100 + (1/(Cc x) - 1)^2 - (1/Cc - 1)^2,  Kv(1) = Kv100,  Kv -> infinity as x -> 0.
 * Kv decreases strictly on 0 < x <= 1, and for small x the outlet passes Cc x a sqrt(2 g H), an
 * orifice, so discharge goes continuously to 0. A manufacturer's Kv curve should replace this law
 * for a real valve (butterfly and cone valves differ markedly).
 */
export function valveLossCoefficient(fullyOpenLoss: number, fraction: number): number {
  if (!(fraction > 0)) return Infinity;
  const x = fraction >= 1 ? 1 : fraction;
  const a = 1 / (VALVE_CONTRACTION * x) - 1;
  const b = 1 / VALVE_CONTRACTION - 1;
  return fullyOpenLoss + a * a - b * b;
}

/**
 * Pressurised conduit: Q = a sqrt(2 g H / (1 + Ke + f L / D + Kv(opening))), with a the bore area,
 * H = pool - max(outlet centreline, tailwater) (free outfall, or submerged when the tailwater is above
 * the outlet centreline). Assumes the conduit flows full: at heads of the order of D above the outlet
 * the intake may draw air and this over-estimates the flow.
 */
export function conduitFlow(
  diameter: number,
  length: number,
  frictionFactor: number,
  entranceLoss: number,
  fullyOpenValveLoss: number,
  percentOpen: number,
  head: number,
): number {
  if (!(percentOpen > 0) || !(head > 0)) return 0;
  return (
    conduitFactor(diameter, length, frictionFactor, entranceLoss, fullyOpenValveLoss, percentOpen) *
    Math.sqrt(TWO_G * head)
  );
}

/** a / sqrt(1 + Ke + f L / D + Kv(opening)): conduitFlow = factor sqrt(2 g H) (0 when shut). */
export function conduitFactor(
  diameter: number,
  length: number,
  frictionFactor: number,
  entranceLoss: number,
  fullyOpenValveLoss: number,
  percentOpen: number,
): number {
  if (!(percentOpen > 0)) return 0;
  const kv = valveLossCoefficient(fullyOpenValveLoss, percentOpen / 100);
  const area = (Math.PI / 4) * diameter * diameter;
  return area / Math.sqrt(1 + entranceLoss + (frictionFactor * length) / diameter + kv);
}
