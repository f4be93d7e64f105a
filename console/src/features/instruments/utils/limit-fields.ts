import { alarmSettingsOf } from '@stillwell/shared/alarms';
import type { LimitFieldChange, ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { convert, type UnitSystem } from '@stillwell/shared/units';
import { levelUnit, seepageUnit } from './units';

/**
 * One editable limit of the limits form: where it sits in the definition, how it shows in the
 * person's units, and the paths by which the gateway (or the shared check) names it in a refusal.
 */
export interface LimitField {
  /** the form's key, unique; also the field's test id (`limit-${key}`) */
  key: string;
  /** the heading it is shown under: a weir, a piezometer, or the pool */
  group: string;
  label: string;
  unit: string;
  /** decimals shown: enough to read and type, not the conversion's noise */
  decimals: number;
  /** the value in the loaded definition, in its own units (m, m3/s, m/h, fraction) */
  si: number;
  toDisplay: (si: number) => number;
  fromDisplay: (shown: number) => number;
  /** request and definition paths that name this field ("seepageWeirs[0].maxFlow") */
  paths: string[];
}

/** How a quantity shows in the form. */
interface Shown {
  unit: string;
  decimals: number;
  toDisplay: (si: number) => number;
  fromDisplay: (shown: number) => number;
}

const PERCENT: Shown = {
  unit: '%',
  decimals: 1,
  toDisplay: (f: number) => f * 100,
  fromDisplay: (p: number) => p / 100,
};
const SAME: Pick<Shown, 'toDisplay' | 'fromDisplay'> = {
  toDisplay: (v: number) => v,
  fromDisplay: (v: number) => v,
};

/** Every limit the form offers, in the order it shows them. */
export function limitFields(def: ReservoirDefinition, system: UnitSystem): LimitField[] {
  const lu = levelUnit(system).unit;
  const qu = seepageUnit(system);
  const rise = system === 'us' ? 'ft/h' : 'm/h';
  const level: Shown = {
    unit: lu,
    decimals: system === 'us' ? 2 : 3,
    toDisplay: (m: number) => convert(m, 'm', lu),
    fromDisplay: (v: number) => convert(v, lu, 'm'),
  };
  const seepage: Shown = {
    unit: qu.label,
    decimals: system === 'us' ? 1 : 2,
    toDisplay: (q: number) => convert(q, 'm3/s', qu.unit),
    fromDisplay: (v: number) => convert(v, qu.unit, 'm3/s'),
  };
  const hours: Shown = { unit: 'h', decimals: 2, ...SAME };
  const fields: LimitField[] = [];
  const pool = 'Pool';

  def.thresholds
    .filter((t) => t.kind === 'alert')
    .forEach((t, i) => {
      const at = def.thresholds.indexOf(t);
      fields.push({
        key: `alert.${t.id}`,
        group: pool,
        label: t.label,
        si: t.elevation,
        ...level,
        paths: [`alertLevels[${i}].elevation`, `thresholds[${at}].elevation`],
      });
    });
  fields.push({
    key: 'rateOfRise.limit',
    group: pool,
    label: 'Rate-of-rise limit',
    si: alarmSettingsOf(def).rateOfRise.limit,
    unit: rise,
    decimals: 3,
    toDisplay: (v) => convert(v, 'm/h', rise),
    fromDisplay: (v) => convert(v, rise, 'm/h'),
    paths: ['alarms.rateOfRise.limit'],
  });

  (def.seepageWeirs ?? []).forEach((w, i) => {
    const at = `seepageWeirs[${i}]`;
    const group = w.label;
    const add = (name: string, label: string, si: number, form: Shown) =>
      fields.push({
        key: `weir.${w.id}.${name}`,
        group,
        label,
        si,
        ...form,
        paths: [`${at}.${name}`],
      });
    const b = w.baseline;
    add('maxFlow', 'Alarm above', w.maxFlow, seepage);
    add('baseline.referenceFlow', 'Baseline flow', b.referenceFlow, seepage);
    add('baseline.referencePool', 'Baseline at pool', b.referencePool, level);
    add('baseline.zeroFlowPool', 'No flow below pool', b.zeroFlowPool, level);
    add('baseline.exponent', 'Exponent', b.exponent, { unit: '', decimals: 3, ...SAME });
    add('baseline.lagHours', 'Lag behind the pool', b.lagHours, hours);
    add('baseline.tolerance', 'Tolerance above baseline', b.tolerance, PERCENT);
    add('baseline.toleranceFlow', 'Tolerance flow', b.toleranceFlow, seepage);
  });

  (def.piezometers ?? []).forEach((p, i) => {
    const at = `piezometers[${i}]`;
    const group = `Piezometer ${p.label}`;
    const add = (name: string, label: string, si: number, form: Shown) =>
      fields.push({
        key: `piezometer.${p.id}.${name}`,
        group,
        label,
        si,
        ...form,
        paths: [`${at}.${name}`],
      });
    add('maxLevel', 'Alarm above', p.maxLevel, level);
    add('baseline.downstreamLevel', 'Drains to', p.baseline.downstreamLevel, level);
    add('baseline.ratio', 'Share of the head', p.baseline.ratio, PERCENT);
    add('baseline.lagHours', 'Lag behind the pool', p.baseline.lagHours, hours);
  });
  return fields;
}

const displayText = (f: LimitField, si: number) =>
  String(Number(f.toDisplay(si).toFixed(f.decimals)));

/**
 * A value as the form shows it. Left as shown, the stored value is sent back exactly, so the
 * rounding of a converted unit (674.21 ft) never changes a limit by itself.
 */
export function shownValue(field: LimitField): string {
  return displayText(field, field.si);
}

export type LimitValues = Record<string, string>;

export function initialValues(fields: readonly LimitField[]): LimitValues {
  return Object.fromEntries(fields.map((f) => [f.key, shownValue(f)]));
}

/** The form key of a changed field as the gateway names it ("seepageWeirs.weir-left.maxFlow"). */
function keyOfChange(field: string): string {
  return field
    .replace(/^seepageWeirs\./, 'weir.')
    .replace(/^piezometers\./, 'piezometer.')
    .replace(/^thresholds\.(.+)\.elevation$/, 'alert.$1')
    .replace(/^alarms\.rateOfRise\.limit$/, 'rateOfRise.limit');
}

const shown = (f: LimitField, v: LimitFieldChange['from']) =>
  typeof v === 'number' ? displayText(f, v) : String(v);

/** A saved change in the form's words and units; a field the form does not show, as named. */
export function describeChange(fields: readonly LimitField[], change: LimitFieldChange): string {
  const f = fields.find((x) => x.key === keyOfChange(change.field));
  if (!f) return `${change.field}: ${String(change.from)} → ${String(change.to)}`;
  const unit = f.unit ? ` ${f.unit}` : '';
  return `${f.group}, ${f.label.toLowerCase()}: ${shown(f, change.from)} → ${shown(f, change.to)}${unit}`;
}
