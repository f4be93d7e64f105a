import { toDisplay, type Quantity, type Unit, type UnitSystem } from '@stillwell/shared/units';
import { DISPLAY_LOCALE } from '../config/display';

/** How a unit is written on screen. */
const UNIT_LABEL: Record<Unit, string> = {
  m: 'm',
  ft: 'ft',
  m3: 'm³',
  'acre-ft': 'acre-ft',
  m2: 'm²',
  acre: 'acre',
  'm3/s': 'm³/s',
  cfs: 'cfs',
  'mm/h': 'mm/h',
  'in/h': 'in/h',
  'm/h': 'm/h',
  'ft/h': 'ft/h',
  'l/s': 'l/s',
  gpm: 'gpm',
  '%': '%',
};

/** Decimals per display unit: enough to see a change that matters, no more. */
const UNIT_DECIMALS: Record<Unit, number> = {
  m: 2,
  ft: 2,
  m3: 0,
  'acre-ft': 0,
  m2: 0,
  acre: 0,
  'm3/s': 1,
  cfs: 0,
  'mm/h': 1,
  'in/h': 2,
  'm/h': 3,
  'ft/h': 2,
  'l/s': 1,
  gpm: 0,
  '%': 0,
};

export function unitLabel(unit: Unit): string {
  return UNIT_LABEL[unit];
}

const numberFormats = new Map<string, Intl.NumberFormat>();

export function formatNumber(value: number, decimals: number, signed = false): string {
  const key = `${decimals}:${signed}`;
  let format = numberFormats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(DISPLAY_LOCALE, {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
      signDisplay: signed ? 'exceptZero' : 'auto',
    });
    numberFormats.set(key, format);
  }
  return format.format(value);
}

export interface DisplayValue {
  /** the number as text, in the display unit */
  text: string;
  /** the number in the display unit, for drawing */
  value: number;
  unit: Unit;
  unitText: string;
}

/** Converts an SI value for display (values arrive in SI and are converted only here). */
export function formatQuantity(
  siValue: number,
  quantity: Quantity,
  system: UnitSystem,
  options: { signed?: boolean } = {},
): DisplayValue {
  const shown = toDisplay(siValue, quantity, system);
  return {
    text: formatNumber(shown.value, UNIT_DECIMALS[shown.unit], options.signed),
    value: shown.value,
    unit: shown.unit,
    unitText: UNIT_LABEL[shown.unit],
  };
}

/** An age in site seconds, coarse enough to read at a glance. */
export function formatAge(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 90) return `${s} s`;
  const minutes = Math.round(s / 60);
  if (minutes < 90) return `${minutes} min`;
  const hours = Math.floor(s / 3600);
  if (hours < 48) return `${hours} h ${Math.floor((s % 3600) / 60)} min`;
  return `${Math.floor(s / 86_400)} d`;
}

export interface SiteTimeText {
  /** 24-hour time, e.g. 14:05:09 */
  time: string;
  /** the zone's short name at that moment, e.g. BST */
  zone: string;
  /** e.g. Tue 3 Mar 2026 */
  date: string;
}

const timeFormats = new Map<string, { time: Intl.DateTimeFormat; date: Intl.DateTimeFormat }>();

function formatsFor(timeZone: string) {
  let formats = timeFormats.get(timeZone);
  if (!formats) {
    formats = {
      time: new Intl.DateTimeFormat(DISPLAY_LOCALE, {
        timeZone,
        hour: '2-digit',
        minute: '2-digit',
        second: '2-digit',
        hourCycle: 'h23',
        timeZoneName: 'short',
      }),
      date: new Intl.DateTimeFormat(DISPLAY_LOCALE, {
        timeZone,
        weekday: 'short',
        day: 'numeric',
        month: 'short',
        year: 'numeric',
      }),
    };
    timeFormats.set(timeZone, formats);
  }
  return formats;
}

/** A moment (epoch ms) as the site's local time, with the zone named. */
export function formatSiteTime(epochMs: number, timeZone: string): SiteTimeText {
  const { time, date } = formatsFor(timeZone);
  const parts = time.formatToParts(epochMs);
  const pick = (type: Intl.DateTimeFormatPartTypes) =>
    parts.find((part) => part.type === type)?.value ?? '';
  return {
    time: `${pick('hour')}:${pick('minute')}:${pick('second')}`,
    zone: pick('timeZoneName'),
    date: date.format(epochMs),
  };
}

const axisFormats = new Map<string, Intl.DateTimeFormat>();

/** A chart tick in the site's zone: 24-hour time, and the day where it changes. */
export function formatAxisTime(epochMs: number, timeZone: string): { time: string; day: string } {
  let format = axisFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat(DISPLAY_LOCALE, {
      timeZone,
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
      day: 'numeric',
      month: 'short',
    });
    axisFormats.set(timeZone, format);
  }
  const parts = format.formatToParts(epochMs);
  const pick = (type: Intl.DateTimeFormatPartTypes) =>
    parts.find((part) => part.type === type)?.value ?? '';
  return { time: `${pick('hour')}:${pick('minute')}`, day: `${pick('day')} ${pick('month')}` };
}
