import { FOOT_M, STANDARD_GRAVITY } from '../units/units.js';

/**
 * Thin-plate triangular (V-notch) weir, the Kindsvater-Shen form (USBR Water Measurement Manual,
 * 3rd ed., ch. 7, eq. 7-3; ISO 1438 gives the same equation for notch angles of 20 to 100 degrees):
 *
 *   Q = Ce (8/15) sqrt(2 g) tan(theta/2) (h + kh)^2.5
 *
 * with h the head over the notch vertex, Ce the effective discharge coefficient and kh the head
 * correction for surface tension and viscosity. In foot units (8/15) sqrt(2 g) is the manual's 4.28.
 * SI throughout: m, m3/s.
 */
export interface VNotchWeir {
  /** notch angle, degrees */
  angleDeg: number;
  /** effective discharge coefficient Ce; default only for 90 degrees */
  dischargeCoefficient?: number;
  /** head correction kh, m; default only for 90 degrees */
  headCorrection?: number;
}

/**
 * The fully contracted 90-degree notch: Ce = 0.578 and kh = 0.0029 ft (USBR Water Measurement
 * Manual, figures 7-6a and 7-6b; ISO 1438 rounds kh to 0.85 mm). Other angles have their own
 * coefficients on those curves: the definition must then give them, nothing is read off a curve here.
 */
export const V_NOTCH_90 = {
  angleDeg: 90,
  dischargeCoefficient: 0.578,
  headCorrection: 0.0029 * FOOT_M,
} as const;

const EIGHT_FIFTEENTHS_ROOT_2G = (8 / 15) * Math.sqrt(2 * STANDARD_GRAVITY);

function coefficients(weir: VNotchWeir): { k: number; kh: number } {
  const { angleDeg } = weir;
  if (!(angleDeg > 0 && angleDeg < 180)) {
    throw new RangeError(`a V-notch angle must be between 0 and 180 degrees, got ${angleDeg}`);
  }
  const is90 = Math.abs(angleDeg - 90) < 1e-9;
  const ce = weir.dischargeCoefficient ?? (is90 ? V_NOTCH_90.dischargeCoefficient : undefined);
  const kh = weir.headCorrection ?? (is90 ? V_NOTCH_90.headCorrection : undefined);
  if (ce === undefined || kh === undefined) {
    throw new RangeError(
      `a ${angleDeg}-degree notch needs its discharge coefficient and head correction (defaults exist for 90 degrees only)`,
    );
  }
  const tanHalf = Math.tan((angleDeg * Math.PI) / 360);
  return { k: ce * EIGHT_FIFTEENTHS_ROOT_2G * tanHalf, kh };
}

/** Flow over the notch, m3/s, for a head over the vertex, m; no head (or a negative one) gives 0. */
export function vNotchFlow(head: number, weir: VNotchWeir = V_NOTCH_90): number {
  const { k, kh } = coefficients(weir);
  if (!(head > 0)) return 0;
  return k * (head + kh) ** 2.5;
}

/** The head over the vertex that passes a flow (the inverse of vNotchFlow), m; 0 for no flow. */
export function vNotchHead(flow: number, weir: VNotchWeir = V_NOTCH_90): number {
  const { k, kh } = coefficients(weir);
  if (!(flow > 0)) return 0;
  return Math.max(0, (flow / k) ** 0.4 - kh);
}
