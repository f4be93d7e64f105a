import { z } from 'zod';
import type { ReservoirDefinition } from '../reservoirs/definition.js';
import { UNITS } from '../units/units.js';
import { prioritySchema, type Priority } from './priorities.js';
import { alarmSettingsOf, DEFAULT_FORECAST_CLEAR_AFTER_S, type AlarmSettings } from './settings.js';

/** What kind of abnormal condition an alarm stands for. */
export const CONDITION_KINDS = [
  'pool-high',
  'rate-of-rise',
  'forecast-crossing',
  'time-left',
  'gauge-disagreement',
  'channel-stale',
  'telemetry-silent',
  'channel-frozen',
  'out-of-range-burst',
  'gate-not-following',
  'order-fault',
  'seepage-high',
  'seepage-above-baseline',
  'piezometer-high',
  'mass-balance',
] as const;
export type ConditionKind = (typeof CONDITION_KINDS)[number];

/** Where the condition is judged: from telemetry here, from the forecast, or by another module. */
export const CONDITION_SOURCES = ['telemetry', 'forecast', 'external'] as const;

export const alarmConditionSchema = z.strictObject({
  /** stable: the alarm's identity in the database, the API and the logbook */
  id: z.string(),
  kind: z.enum(CONDITION_KINDS),
  label: z.string(),
  priority: prioritySchema,
  source: z.enum(CONDITION_SOURCES),
  /** unit of value, limit and deadband */
  unit: z.enum(UNITS).nullable(),
  limit: z.number().nullable(),
  deadband: z.number().nullable(),
  onDelayS: z.number(),
  /** the condition must be over this long before the alarm clears (0: at once) */
  offDelayS: z.number(),
  /** the channel, device, instrument or threshold it watches */
  subject: z.string().nullable(),
});
export type AlarmCondition = z.infer<typeof alarmConditionSchema>;

const m = (v: number) => `${v.toFixed(2)} m`;

/** A device is alarmed stale this long after its channel passes its stale limit. */
export const STALE_GRACE_S = 60;

/** Devices whose silence blinds the operator to the pool or the releases. */
const KEY_ROLES = new Set(['pool', 'inflow', 'outflow', 'gate-opening', 'valve-opening']);

/**
 * Every alarm condition a reservoir's definition gives rise to, with its limits resolved. The
 * order is the catalog's: pool, forecast, instruments, data quality, equipment.
 */
export function buildConditions(
  def: ReservoirDefinition,
  settings: AlarmSettings = alarmSettingsOf(def),
): AlarmCondition[] {
  const out: AlarmCondition[] = [];
  const add = (
    c: Omit<AlarmCondition, 'deadband' | 'onDelayS' | 'offDelayS' | 'unit' | 'limit'> &
      Partial<AlarmCondition>,
  ) => out.push({ unit: null, limit: null, deadband: null, onDelayS: 0, offDelayS: 0, ...c });

  for (const p of settings.poolLevels) {
    const t = def.thresholds.find((x) => x.id === p.thresholdId);
    if (!t) continue;
    add({
      id: `pool-high.${t.id}`,
      kind: 'pool-high',
      label: `Pool above ${t.label} (${m(t.elevation)})`,
      priority: p.priority,
      source: 'telemetry',
      unit: 'm',
      limit: t.elevation,
      deadband: p.deadband,
      onDelayS: p.onDelayS,
      subject: t.id,
    });
  }
  const rise = settings.rateOfRise;
  const filling = rise.firstFilling.active;
  add({
    id: 'rate-of-rise',
    kind: 'rate-of-rise',
    label: filling ? 'Pool rising faster than the first-filling limit' : 'Pool rising fast',
    priority: 'prompt',
    source: 'telemetry',
    unit: 'm/h',
    limit: filling ? rise.firstFilling.limit : rise.limit,
    deadband: filling ? Math.min(rise.deadband, rise.firstFilling.limit / 4) : rise.deadband,
    onDelayS: rise.onDelayS,
    subject: def.poolChannels[0] ?? null,
  });
  const forecastClear = settings.forecast.clearAfterS ?? DEFAULT_FORECAST_CLEAR_AFTER_S;
  for (const id of settings.forecast.thresholds) {
    const t = def.thresholds.find((x) => x.id === id);
    if (!t) continue;
    add({
      id: `forecast-crossing.${t.id}`,
      kind: 'forecast-crossing',
      label: `Forecast reaches ${t.label} (${m(t.elevation)}) within ${settings.forecast.horizonS / 3600} h`,
      priority: 'prompt',
      source: 'forecast',
      unit: 'm',
      limit: t.elevation,
      offDelayS: forecastClear,
      subject: t.id,
    });
  }
  add({
    id: 'time-left',
    kind: 'time-left',
    label: `Time left to act under ${settings.forecast.timeLeftMarginS / 3600} h`,
    priority: 'immediate',
    source: 'forecast',
    unit: null,
    limit: settings.forecast.timeLeftMarginS,
    deadband: settings.forecast.timeLeftDeadbandS,
    offDelayS: forecastClear,
    subject: null,
  });
  if (def.poolChannels.length >= 2) {
    const g = settings.gaugeDisagreement;
    add({
      id: 'gauge-disagreement',
      kind: 'gauge-disagreement',
      label: `Pool gauges disagree by more than ${m(g.tolerance)}`,
      priority: 'prompt',
      source: 'telemetry',
      unit: 'm',
      limit: g.tolerance,
      deadband: g.deadband,
      onDelayS: g.onDelayS,
      subject: def.poolChannels.slice(0, 2).join(' / '),
    });
  }
  for (const w of def.seepageWeirs ?? []) {
    add({
      id: `seepage-high.${w.id}`,
      kind: 'seepage-high',
      label: `Seepage high at the ${w.label.toLowerCase()}`,
      priority: 'immediate',
      source: 'telemetry',
      unit: 'm3/s',
      limit: w.maxFlow,
      deadband: w.maxFlow * settings.seepage.deadbandFraction,
      onDelayS: settings.seepage.onDelayS,
      subject: w.id,
    });
    add({
      id: `seepage-baseline.${w.id}`,
      kind: 'seepage-above-baseline',
      label: `Seepage rising against its baseline at the ${w.label.toLowerCase()}`,
      priority: 'prompt',
      source: 'telemetry',
      unit: 'm3/s',
      limit: null,
      deadband: w.baseline.toleranceFlow / 2,
      onDelayS: settings.seepage.onDelayS,
      subject: w.id,
    });
  }
  for (const p of def.piezometers ?? []) {
    add({
      id: `piezometer-high.${p.id}`,
      kind: 'piezometer-high',
      label: `Piezometric level high at ${p.label} (${p.location})`,
      priority: 'prompt',
      source: 'telemetry',
      unit: 'm',
      limit: p.maxLevel,
      deadband: settings.piezometers.deadband,
      onDelayS: settings.piezometers.onDelayS,
      subject: p.id,
    });
  }
  const roles = new Set(def.channels.map((c) => c.role));
  if (roles.has('inflow') && roles.has('outflow')) {
    const mb = settings.massBalance;
    add({
      id: 'mass-balance',
      kind: 'mass-balance',
      label: 'Water unaccounted for: storage change disagrees with inflow and outflow',
      priority: 'prompt',
      source: 'telemetry',
      unit: 'm3/s',
      limit: mb.toleranceFlow,
      deadband: null,
      onDelayS: mb.onDelayS,
      subject: null,
    });
  }
  const devices = [...new Set(def.channels.map((c) => c.deviceId))];
  add({
    id: 'telemetry-silent',
    kind: 'telemetry-silent',
    label: 'No instrument is reporting',
    priority: 'immediate',
    source: 'telemetry',
    subject: null,
  });
  for (const d of devices) {
    const channels = def.channels.filter((c) => c.deviceId === d);
    const key = channels.some((c) => KEY_ROLES.has(c.role));
    add({
      id: `stale.${d}`,
      kind: 'channel-stale',
      label: `No readings from ${d} (${channels.map((c) => c.label).join(', ')})`,
      priority: key ? 'prompt' : 'advisory',
      source: 'telemetry',
      // gives the single whole-feed alarm time to take over when every device falls silent
      onDelayS: STALE_GRACE_S,
      subject: d,
    });
  }
  for (const f of settings.frozen) {
    const c = def.channels.find((x) => x.id === f.channel);
    if (!c) continue;
    add({
      id: `frozen.${c.id}`,
      kind: 'channel-frozen',
      label: `${c.label} frozen (no change for ${f.afterS / 60} min)`,
      priority: KEY_ROLES.has(c.role) ? 'prompt' : 'advisory',
      source: 'telemetry',
      unit: c.unit,
      limit: f.band,
      onDelayS: 0,
      subject: c.id,
    });
  }
  for (const c of def.channels) {
    add({
      id: `out-of-range.${c.id}`,
      kind: 'out-of-range-burst',
      label: `${c.label} reporting values outside its range`,
      priority: KEY_ROLES.has(c.role) ? 'prompt' : 'advisory',
      source: 'telemetry',
      subject: c.id,
    });
  }
  for (const s of def.structures) {
    const movers =
      s.kind === 'gated-spillway'
        ? s.gates.map((g) => ({ id: g.id, label: g.id.replace('gate-', 'Gate ') }))
        : s.kind === 'low-level-outlet'
          ? [{ id: s.id, label: `${s.name} valve` }]
          : [];
    for (const a of movers) {
      add({
        id: `gate-not-following.${a.id}`,
        kind: 'gate-not-following',
        label: `${a.label} not following its command`,
        priority: 'immediate' satisfies Priority,
        source: 'external',
        subject: a.id,
      });
    }
  }
  // a gate operation order that went wrong, as the gate-orders module reports it
  for (const [id, label] of ORDER_FAULTS) {
    add({
      id,
      kind: 'order-fault',
      label,
      priority: 'immediate',
      source: 'external',
      subject: null,
    });
  }
  return out;
}

/** The order faults the gate-orders module reports, as alarm conditions. */
export const ORDER_FAULTS: ReadonlyArray<readonly [string, string]> = [
  ['order-not-following', 'A gate or valve is not following its order'],
  ['order-ack-missing', 'The gate controller has not acknowledged an order'],
  ['order-command-refused', 'The gate controller refused an order'],
];
