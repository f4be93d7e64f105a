import { z } from 'zod';
import { alarmLimitsSchema } from '../alarms/limits.js';
import { alarmSettingsOf } from '../alarms/settings.js';
import { idSchema } from '../telemetry/message.js';
import {
  piezometerSchema,
  reservoirDefinitionSchema,
  seepageWeirSchema,
  type ReservoirDefinition,
} from './definition.js';

/**
 * A change of limits only: alarm limits, the reservoir's alert levels, the seepage-weir and
 * piezometer thresholds and baselines. What the instruments are and where they report, the
 * physical levels (crests) and the structures stay as they are: those are the administrator's
 * definition upload. Every accepted change is a new version of the definition.
 */

/** The shortest note accepted: a limit changed without saying why cannot be reviewed. */
export const LIMITS_NOTE_MIN = 4;
export const LIMITS_NOTE_MAX = 500;

export const alertLevelChangeSchema = z.strictObject({ id: idSchema, elevation: z.number() });

export const weirLimitsChangeSchema = z.strictObject({
  id: idSchema,
  maxFlow: seepageWeirSchema.shape.maxFlow.optional(),
  baseline: seepageWeirSchema.shape.baseline.partial().optional(),
});

export const piezometerLimitsChangeSchema = z.strictObject({
  id: idSchema,
  maxLevel: piezometerSchema.shape.maxLevel.optional(),
  baseline: piezometerSchema.shape.baseline.partial().optional(),
});

/** POST /api/reservoirs/:id/definition/limits */
export const limitsChangeSchema = z.strictObject({
  /** the version the change was made on: another change in between refuses it (409) */
  baseVersion: z.number().int().min(1),
  /** why the limits change: kept with the version and in the logbook */
  note: z
    .string()
    .trim()
    .min(LIMITS_NOTE_MIN, `say why the limits change (at least ${LIMITS_NOTE_MIN} characters)`)
    .max(LIMITS_NOTE_MAX),
  /** alarm sections given replace those sections whole; sections left out stay as they are */
  alarms: alarmLimitsSchema.optional(),
  /** new elevations of thresholds of kind "alert" */
  alertLevels: z.array(alertLevelChangeSchema).max(50).optional(),
  seepageWeirs: z.array(weirLimitsChangeSchema).max(50).optional(),
  piezometers: z.array(piezometerLimitsChangeSchema).max(200).optional(),
});
export type LimitsChange = z.infer<typeof limitsChangeSchema>;

const scalar = z.union([z.number(), z.string(), z.boolean(), z.null()]);
export const limitFieldChangeSchema = z.strictObject({
  /** e.g. "seepageWeirs.weir-left.maxFlow", "alarms.rateOfRise.limit" */
  field: z.string(),
  from: scalar,
  to: scalar,
});
export type LimitFieldChange = z.infer<typeof limitFieldChangeSchema>;

export const limitsChangeResultSchema = z.strictObject({
  reservoirId: z.string(),
  version: z.number().int(),
  previousVersion: z.number().int().nullable(),
  change: z.literal('limits'),
  changes: z.array(limitFieldChangeSchema),
});
export type LimitsChangeResult = z.infer<typeof limitsChangeResultSchema>;

/** A refused field: the request's path ("seepageWeirs[1].maxFlow") and what is wrong. */
export interface LimitsProblem {
  field: string;
  message: string;
}

export type LimitsOutcome =
  | { ok: true; definition: ReservoirDefinition; changes: LimitFieldChange[] }
  | { ok: false; problems: LimitsProblem[] };

/** A zod path as people write it: seepageWeirs[0].baseline.tolerance */
export function fieldPath(path: readonly PropertyKey[]): string {
  return path
    .map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i ? '.' : ''}${String(p)}`))
    .join('');
}

/**
 * Applies a checked change to a definition, or says field by field why not. Pure: the gateway
 * stores the result as a new version, the console may run it to preview the differences.
 */
export function applyLimitsChange(def: ReservoirDefinition, change: LimitsChange): LimitsOutcome {
  const problems: LimitsProblem[] = [];
  const thresholds = def.thresholds.map((t) => ({ ...t }));
  const weirs = (def.seepageWeirs ?? []).map((w) => ({ ...w, baseline: { ...w.baseline } }));
  const piezometers = (def.piezometers ?? []).map((p) => ({ ...p, baseline: { ...p.baseline } }));

  const seen = (list: string, ids: string[]) =>
    ids.forEach((id, i) => {
      const first = ids.indexOf(id);
      if (first !== i)
        problems.push({ field: `${list}[${i}].id`, message: `"${id}" repeats ${list}[${first}]` });
    });
  seen(
    'alertLevels',
    (change.alertLevels ?? []).map((a) => a.id),
  );
  seen(
    'seepageWeirs',
    (change.seepageWeirs ?? []).map((a) => a.id),
  );
  seen(
    'piezometers',
    (change.piezometers ?? []).map((a) => a.id),
  );

  change.alertLevels?.forEach((a, i) => {
    const t = thresholds.find((x) => x.id === a.id);
    if (!t)
      return problems.push({ field: `alertLevels[${i}].id`, message: `no threshold "${a.id}"` });
    if (t.kind !== 'alert')
      return problems.push({
        field: `alertLevels[${i}].id`,
        message: `"${a.id}" is a physical level (${t.kind}), not an alert level: it changes with the definition upload`,
      });
    if (!(a.elevation > def.riverbedElevation && a.elevation < def.damCrestElevation))
      return problems.push({
        field: `alertLevels[${i}].elevation`,
        message: `must lie between the riverbed (${def.riverbedElevation} m) and the dam crest (${def.damCrestElevation} m)`,
      });
    t.elevation = a.elevation;
  });
  change.seepageWeirs?.forEach((c, i) => {
    const w = weirs.find((x) => x.id === c.id);
    if (!w)
      return problems.push({
        field: `seepageWeirs[${i}].id`,
        message: `no seepage weir "${c.id}"`,
      });
    if (c.maxFlow !== undefined) w.maxFlow = c.maxFlow;
    Object.assign(w.baseline, definedOnly(c.baseline));
  });
  change.piezometers?.forEach((c, i) => {
    const p = piezometers.find((x) => x.id === c.id);
    if (!p)
      return problems.push({ field: `piezometers[${i}].id`, message: `no piezometer "${c.id}"` });
    if (c.maxLevel !== undefined) p.maxLevel = c.maxLevel;
    Object.assign(p.baseline, definedOnly(c.baseline));
  });
  if (problems.length) return { ok: false, problems };

  const candidate = {
    ...def,
    thresholds,
    ...(def.seepageWeirs ? { seepageWeirs: weirs } : {}),
    ...(def.piezometers ? { piezometers: piezometers } : {}),
    ...(change.alarms ? { alarms: { ...def.alarms, ...definedOnly(change.alarms) } } : {}),
  };
  // the whole definition again: its cross-checks (thresholds named by alarms, baselines) hold
  const parsed = reservoirDefinitionSchema.safeParse(candidate);
  if (!parsed.success)
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => ({
        field: fieldPath(i.path) || '(body)',
        message: i.message,
      })),
    };
  const changes = diffLimits(def, parsed.data);
  if (!changes.length)
    return {
      ok: false,
      problems: [{ field: '(body)', message: 'no limit differs from the current version' }],
    };
  return { ok: true, definition: parsed.data, changes };
}

/** Every limit that differs between two definitions, leaf by leaf, for the logbook. */
export function diffLimits(a: ReservoirDefinition, b: ReservoirDefinition): LimitFieldChange[] {
  const flat = (d: ReservoirDefinition) => {
    const out = new Map<string, string | number | boolean | null>();
    const walk = (prefix: string, v: unknown) => {
      if (v !== null && typeof v === 'object') {
        for (const [k, x] of Object.entries(v)) walk(`${prefix}.${k}`, x);
      } else if (v !== undefined) out.set(prefix, v as string | number | boolean | null);
    };
    for (const t of d.thresholds) walk(`thresholds.${t.id}.elevation`, t.elevation);
    for (const w of d.seepageWeirs ?? []) {
      walk(`seepageWeirs.${w.id}.maxFlow`, w.maxFlow);
      walk(`seepageWeirs.${w.id}.baseline`, w.baseline);
    }
    for (const p of d.piezometers ?? []) {
      walk(`piezometers.${p.id}.maxLevel`, p.maxLevel);
      walk(`piezometers.${p.id}.baseline`, p.baseline);
    }
    // the limits in force, defaults filled in: a section written out as the default is no change
    const s = alarmSettingsOf(d);
    walk('alarms', {
      ...s,
      poolLevels: Object.fromEntries(s.poolLevels.map((p) => [p.thresholdId, p])),
      frozen: Object.fromEntries(s.frozen.map((f) => [f.channel, f])),
    });
    return out;
  };
  const before = flat(a);
  const after = flat(b);
  const out: LimitFieldChange[] = [];
  for (const field of new Set([...before.keys(), ...after.keys()])) {
    const from = before.get(field) ?? null;
    const to = after.get(field) ?? null;
    if (from !== to && !field.endsWith('.thresholdId') && !field.endsWith('.channel'))
      out.push({ field, from, to });
  }
  return out;
}

function definedOnly<T extends object>(o: T | undefined): Partial<T> {
  return Object.fromEntries(
    Object.entries(o ?? {}).filter(([, v]) => v !== undefined),
  ) as Partial<T>;
}
