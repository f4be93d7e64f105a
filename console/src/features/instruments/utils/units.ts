import { convert, type UnitSystem } from '@stillwell/shared/units';
import { formatNumber } from '../../../lib/format';

/** Seepage is small: litres per second (SI) or US gallons per minute, not m3/s or cfs. */
export function seepageUnit(system: UnitSystem): {
  unit: 'l/s' | 'gpm';
  label: string;
  digits: number;
} {
  return system === 'us'
    ? { unit: 'gpm', label: 'gpm', digits: 0 }
    : { unit: 'l/s', label: 'l/s', digits: 1 };
}

export function seepageText(m3s: number, system: UnitSystem): string {
  const u = seepageUnit(system);
  return `${formatNumber(convert(m3s, 'm3/s', u.unit), u.digits)} ${u.label}`;
}

export function levelUnit(system: UnitSystem): { unit: 'm' | 'ft'; digits: number } {
  return system === 'us' ? { unit: 'ft', digits: 1 } : { unit: 'm', digits: 1 };
}

export const toLevel = (m: number, system: UnitSystem) => convert(m, 'm', levelUnit(system).unit);
export const toSeepage = (m3s: number, system: UnitSystem) =>
  convert(m3s, 'm3/s', seepageUnit(system).unit);
