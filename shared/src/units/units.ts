/**
 * Units of measure. Stillwell computes in SI; US customary is for display only.
 * Factors are exact by definition and tabulated in NIST SP 811 (2008), Appendix B.8/B.9.
 * The acre-foot uses the international foot (1 ft = 0.3048 m exactly), not the US survey foot.
 */
export const FOOT_M = 0.3048;
export const INCH_M = 0.0254;
export const ACRE_M2 = 4046.8564224;
export const ACRE_FOOT_M3 = ACRE_M2 * FOOT_M; // 1233.48183754752 m3
export const CUBIC_FOOT_M3 = FOOT_M ** 3; // 0.028316846592 m3
export const STANDARD_GRAVITY = 9.80665; // m/s2, CGPM 1901, as tabulated in NIST SP 811

export const UNITS = [
  'm',
  'ft',
  'm3',
  'acre-ft',
  'm2',
  'acre',
  'm3/s',
  'cfs',
  'mm/h',
  'in/h',
  'm/h',
  'ft/h',
  'l/s',
  'gpm',
  '%',
] as const;
export type Unit = (typeof UNITS)[number];

export type Quantity = 'length' | 'volume' | 'area' | 'flow' | 'rainRate' | 'riseRate' | 'ratio';

interface UnitInfo {
  quantity: Quantity;
  /** multiply a value in this unit by toSi to get the SI base unit of its quantity */
  toSi: number;
}

const US_GALLON_M3 = 231 * INCH_M ** 3; // NIST SP 811: gallon (US liquid) = 231 in3

const UNIT_INFO: Record<Unit, UnitInfo> = {
  m: { quantity: 'length', toSi: 1 },
  ft: { quantity: 'length', toSi: FOOT_M },
  m3: { quantity: 'volume', toSi: 1 },
  'acre-ft': { quantity: 'volume', toSi: ACRE_FOOT_M3 },
  m2: { quantity: 'area', toSi: 1 },
  acre: { quantity: 'area', toSi: ACRE_M2 },
  'm3/s': { quantity: 'flow', toSi: 1 },
  cfs: { quantity: 'flow', toSi: CUBIC_FOOT_M3 },
  'l/s': { quantity: 'flow', toSi: 0.001 },
  gpm: { quantity: 'flow', toSi: US_GALLON_M3 / 60 },
  'mm/h': { quantity: 'rainRate', toSi: 1 },
  'in/h': { quantity: 'rainRate', toSi: 25.4 },
  'm/h': { quantity: 'riseRate', toSi: 1 },
  'ft/h': { quantity: 'riseRate', toSi: FOOT_M },
  '%': { quantity: 'ratio', toSi: 1 },
};

/** The unit each quantity is stored and computed in. */
export const SI_UNIT: Record<Quantity, Unit> = {
  length: 'm',
  volume: 'm3',
  area: 'm2',
  flow: 'm3/s',
  rainRate: 'mm/h',
  riseRate: 'm/h',
  ratio: '%',
};

export const US_UNIT: Record<Quantity, Unit> = {
  length: 'ft',
  volume: 'acre-ft',
  area: 'acre',
  flow: 'cfs',
  rainRate: 'in/h',
  riseRate: 'ft/h',
  ratio: '%',
};

export type UnitSystem = 'si' | 'us';

export function isUnit(value: string): value is Unit {
  return (UNITS as readonly string[]).includes(value);
}

export function quantityOf(unit: Unit): Quantity {
  return UNIT_INFO[unit].quantity;
}

/** Converts between two units of the same quantity; throws if they measure different things. */
export function convert(value: number, from: Unit, to: Unit): number {
  const a = UNIT_INFO[from];
  const b = UNIT_INFO[to];
  if (a.quantity !== b.quantity) {
    throw new RangeError(`cannot convert ${from} (${a.quantity}) to ${to} (${b.quantity})`);
  }
  return from === to ? value : (value * a.toSi) / b.toSi;
}

export function displayUnit(quantity: Quantity, system: UnitSystem): Unit {
  return system === 'us' ? US_UNIT[quantity] : SI_UNIT[quantity];
}

/** Converts an SI value of a quantity to the display system; returns the value and its unit. */
export function toDisplay(
  siValue: number,
  quantity: Quantity,
  system: UnitSystem,
): { value: number; unit: Unit } {
  const unit = displayUnit(quantity, system);
  return { value: convert(siValue, SI_UNIT[quantity], unit), unit };
}
