// Bare typed-array loops doing the same arithmetic as the engine for the demo reservoir: the
// storage-indication step with the same Hermite storage curve, the same Newton iteration and the same
// discharge formulas, but hand-inlined for Lake Orrin (3 equal gates, one weir, one outlet), with no
// closures, no schedule machinery and no checks. The engine's time over this one is its overhead.
import { DEMO_RESERVOIR } from '../src/reservoirs/demo.js';
import type { StorageCurve } from '../src/hydraulics/index.js';
import { STANDARD_GRAVITY } from '../src/units/units.js';

const spill = DEMO_RESERVOIR.structures.find((s) => s.kind === 'gated-spillway')!;
const aux = DEMO_RESERVOIR.structures.find((s) => s.kind === 'broad-crested-weir')!;
const llo = DEMO_RESERVOIR.structures.find((s) => s.kind === 'low-level-outlet')!;
if (
  spill.kind !== 'gated-spillway' ||
  aux.kind !== 'broad-crested-weir' ||
  llo.kind !== 'low-level-outlet'
) {
  throw new Error('unexpected demo structures');
}
const G2 = 2 * STANDARD_GRAVITY;
const ZC = spill.crestElevation;
const CW = spill.coefficient;
const CG = spill.gates[0]!.orificeCoefficient;
const B = spill.gates[0]!.width;
const NG = spill.gates.length;
const ZA = aux.crestElevation;
const CA = aux.coefficient * aux.length;
const ZO = llo.outletElevation;
const AREA = (Math.PI / 4) * llo.diameter ** 2;

/** Outlet factor a / sqrt(1 + Ke + fL/D + Kv(p)) for a fixed valve opening p (%). */
export function outletFactor(percent: number): number {
  if (percent <= 0) return 0;
  const x = Math.min(1, percent / 100);
  const kv = llo.valveLossCoefficient + (1 / (0.62 * x) - 1) ** 2 - (1 / 0.62 - 1) ** 2;
  return (
    AREA /
    Math.sqrt(
      1 + llo.entranceLossCoefficient + (llo.frictionFactor * llo.length) / llo.diameter + kv,
    )
  );
}

function outflow(h: number, g: number, of: number): number {
  let q = 0;
  const head = h - ZC;
  if (g > 0 && head > 0) {
    for (let k = 0; k < NG; k++) {
      // same regime choice as gateBayFlow (free flow): compare squares, one square root
      if (g >= head) q += CW * B * head * Math.sqrt(head);
      else {
        const hc = head - g / 2;
        const qo2 = CG * CG * G2 * g * g * hc;
        if (qo2 >= CW * CW * head * head * head) q += CW * B * head * Math.sqrt(head);
        else if (qo2 > CW * CW * g * g * g) q += CG * g * B * Math.sqrt(G2 * hc);
        else q += CW * B * g * Math.sqrt(g);
      }
    }
  }
  const ha = h - ZA;
  if (ha > 0) q += CA * ha * Math.sqrt(ha);
  const ho = h - ZO;
  if (ho > 0) q += of * Math.sqrt(G2 * ho);
  return q;
}

/**
 * Routes the demo reservoir: all gates ramp at `speed` from 0 towards `target` from time `gateStart`,
 * the outlet valve fixed. Writes elevations into `out` (if given); returns the peak elevation.
 */
export function bareRoute(
  curve: StorageCurve,
  inflow: Float64Array,
  dt: number,
  steps: number,
  h0: number,
  gateStart: number,
  target: number,
  valvePercent: number,
  out?: Float64Array,
): number {
  const x = curve.knots.elevation;
  const y = curve.knots.storage;
  const d = curve.knots.slope;
  const nk = x.length;
  const speed = spill.gates[0]!.travelSpeed;
  const of = outletFactor(valvePercent);
  const k2 = 2 / dt;
  const seg = (v: number) => {
    let lo = 0;
    let hi = nk - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (x[mid]! <= v) lo = mid;
      else hi = mid;
    }
    return lo;
  };
  let h = h0;
  let hLast = h0;
  let i = seg(h);
  let t = (h - x[i]!) / (x[i + 1]! - x[i]!);
  const hs = () => x[i + 1]! - x[i]!;
  const sAt = () => {
    const t2 = t * t;
    const t3 = t2 * t;
    return (
      (2 * t3 - 3 * t2 + 1) * y[i]! +
      (t3 - 2 * t2 + t) * hs() * d[i]! +
      (-2 * t3 + 3 * t2) * y[i + 1]! +
      (t3 - t2) * hs() * d[i + 1]!
    );
  };
  const aAt = () => {
    const t2 = t * t;
    return (
      ((6 * t2 - 6 * t) * (y[i]! - y[i + 1]!)) / hs() +
      (3 * t2 - 4 * t + 1) * d[i]! +
      (3 * t2 - 2 * t) * d[i + 1]!
    );
  };
  let s = sAt();
  let o = outflow(h, 0, of);
  let slopeO = 0;
  let peak = h;
  if (out) out[0] = h;
  for (let n = 0; n < steps; n++) {
    const tb = (n + 1) * dt;
    const gn = tb <= gateStart ? 0 : Math.min(target, speed * (tb - gateStart));
    const rhs = inflow[n]! + inflow[n + 1]! + k2 * s - o;
    let lo = x[0]!;
    let hi = x[nk - 1]!;
    let hn = 2 * h - hLast;
    let hPrev = NaN;
    let oPrev = NaN;
    let sN = 0;
    let oN = 0;
    for (let it = 0; it < 200; it++) {
      i = seg(hn);
      t = (hn - x[i]!) / hs();
      sN = sAt();
      oN = outflow(hn, gn, of);
      const f = k2 * sN + oN - rhs;
      if (f < 0) lo = hn;
      else hi = hn;
      if (it > 0 && hn !== hPrev) {
        const sl = (oN - oPrev) / (hn - hPrev);
        slopeO = sl > 0 ? sl : 0;
      }
      const deriv = k2 * aAt() + slopeO;
      const step = f / deriv;
      const a = Math.abs(step);
      if (a <= 1e-4 && a * slopeO <= 1e-7 * deriv && hn - step > lo && hn - step < hi) {
        hn -= step;
        oN -= slopeO * step;
        sN = 0.5 * dt * (rhs - oN);
        break;
      }
      if (hi - lo <= 1e-10) break;
      let c = hn - step;
      if (!(c > lo && c < hi)) c = 0.5 * (lo + hi);
      hPrev = hn;
      oPrev = oN;
      hn = c;
    }
    hLast = h;
    h = hn;
    s = sN;
    o = oN;
    if (h > peak) peak = h;
    if (out) out[n + 1] = h;
  }
  return peak;
}
