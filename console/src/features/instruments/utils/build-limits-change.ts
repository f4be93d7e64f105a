import { alarmSettingsOf } from '@stillwell/shared/alarms';
import {
  applyLimitsChange,
  fieldPath,
  limitsChangeSchema,
  type LimitFieldChange,
  type LimitsChange,
  type ReservoirDefinition,
} from '@stillwell/shared/reservoirs';
import { shownValue, type LimitField, type LimitValues } from './limit-fields';
import { placeProblems, type PlacedProblems } from './limits-problems';

export type BuiltLimitsChange =
  | { ok: true; change: LimitsChange; changes: LimitFieldChange[] }
  | ({ ok: false } & PlacedProblems);

/**
 * The request the form's values make, checked with the same shared rules the gateway applies, so
 * most mistakes show beside their field before anything is sent. Every weir, piezometer and alert
 * level goes in the definition's order (a refusal's index then names the same one); a value left
 * as it was loaded is sent exactly as stored, not as its rounded display, and a typed one without
 * the unit conversion's float noise (16.5 l/s is 0.0165 m3/s, not 0.016499999999999997).
 */
export function buildLimitsChange(
  def: ReservoirDefinition,
  baseVersion: number,
  fields: readonly LimitField[],
  values: LimitValues,
  note: string,
): BuiltLimitsChange {
  const si = new Map<string, number>();
  const typed: Record<string, string> = {};
  for (const f of fields) {
    const text = (values[f.key] ?? '').trim();
    if (text === shownValue(f)) si.set(f.key, f.si);
    else if (text === '' || !Number.isFinite(Number(text))) typed[f.key] = 'enter a number';
    else si.set(f.key, Number(f.fromDisplay(Number(text)).toPrecision(12)));
  }
  if (Object.keys(typed).length) return { ok: false, fields: typed, general: [] };
  const v = (key: string) => si.get(key)!;

  const rise = alarmSettingsOf(def).rateOfRise;
  const riseLimit = v('rateOfRise.limit');
  const change: LimitsChange = {
    baseVersion,
    note,
    alertLevels: def.thresholds
      .filter((t) => t.kind === 'alert')
      .map((t) => ({ id: t.id, elevation: v(`alert.${t.id}`) })),
    seepageWeirs: (def.seepageWeirs ?? []).map((w) => {
      const k = (name: string) => v(`weir.${w.id}.${name}`);
      return {
        id: w.id,
        maxFlow: k('maxFlow'),
        baseline: {
          referenceFlow: k('baseline.referenceFlow'),
          referencePool: k('baseline.referencePool'),
          zeroFlowPool: k('baseline.zeroFlowPool'),
          exponent: k('baseline.exponent'),
          lagHours: k('baseline.lagHours'),
          tolerance: k('baseline.tolerance'),
          toleranceFlow: k('baseline.toleranceFlow'),
        },
      };
    }),
    piezometers: (def.piezometers ?? []).map((p) => {
      const k = (name: string) => v(`piezometer.${p.id}.${name}`);
      return {
        id: p.id,
        maxLevel: k('maxLevel'),
        baseline: {
          downstreamLevel: k('baseline.downstreamLevel'),
          ratio: k('baseline.ratio'),
          lagHours: k('baseline.lagHours'),
        },
      };
    }),
    // an alarm section is replaced whole: sent only when its limit changes, the rest as in force
    ...(riseLimit !== rise.limit ? { alarms: { rateOfRise: { ...rise, limit: riseLimit } } } : {}),
  };

  const parsed = limitsChangeSchema.safeParse(change);
  if (!parsed.success)
    return {
      ok: false,
      ...placeProblems(
        fields,
        parsed.error.issues.map((i) => ({ field: fieldPath(i.path), message: i.message })),
      ),
    };
  const outcome = applyLimitsChange(def, parsed.data);
  if (!outcome.ok) return { ok: false, ...placeProblems(fields, outcome.problems) };
  return { ok: true, change: parsed.data, changes: outcome.changes };
}
