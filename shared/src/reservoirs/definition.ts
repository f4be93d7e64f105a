import { z } from 'zod';
import { channelIdSchema, idSchema } from '../telemetry/message.js';
import { storageRowSchema, structureSchema } from '../hydraulics/schema.js';
import { UNITS } from '../units/units.js';
import { alarmLimitsSchema } from '../alarms/limits.js';

/** What a channel measures, so that the gateway knows which one is the pool, the inflow, ... */
export const CHANNEL_ROLES = [
  'pool',
  'inflow',
  'outflow',
  'rain',
  'gate-opening',
  'valve-opening',
  'tailwater',
  /** head over a seepage weir's notch vertex, m */
  'seepage-weir-head',
  /** piezometric level (an elevation), m */
  'piezometer',
] as const;
export type ChannelRole = (typeof CHANNEL_ROLES)[number];

export const channelDefinitionSchema = z.strictObject({
  id: channelIdSchema,
  deviceId: idSchema,
  label: z.string().min(1).max(80),
  role: z.enum(CHANNEL_ROLES),
  /** the SI unit readings are stored in */
  unit: z.enum(UNITS),
  /** physical range: a value outside it cannot be a true reading */
  min: z.number(),
  max: z.number(),
  /** the device's normal reporting interval, s */
  intervalS: z.number().positive(),
  /** no reading for this long (site time) marks the channel stale, s */
  staleAfterS: z.number().positive(),
});
export type ChannelDefinition = z.infer<typeof channelDefinitionSchema>;

export const THRESHOLD_KINDS = [
  'alert',
  'spillway-crest',
  'auxiliary-spillway',
  'crest-less-freeboard',
  'dam-crest',
] as const;
export type ThresholdKind = (typeof THRESHOLD_KINDS)[number];

export const thresholdSchema = z.strictObject({
  id: idSchema,
  label: z.string().min(1).max(80),
  kind: z.enum(THRESHOLD_KINDS),
  elevation: z.number(),
});
export type Threshold = z.infer<typeof thresholdSchema>;

/**
 * A V-notch seepage weir at an abutment. Its channel reports the head over the notch; the flow is
 * computed with the V-notch equation (hydraulics/v-notch.ts). The baseline is how this weir has
 * answered the pool so far: in the steady state Q = referenceFlow ((pool - zeroFlowPool) /
 * (referencePool - zeroFlowPool))^exponent, following the pool with a first-order lag.
 */
export const seepageWeirSchema = z.strictObject({
  id: idSchema,
  label: z.string().min(1).max(80),
  abutment: z.enum(['left', 'right']),
  channel: channelIdSchema,
  notchAngleDeg: z.number().gt(0).lt(180),
  /** Ce and kh: required unless the notch is 90 degrees */
  dischargeCoefficient: z.number().positive().optional(),
  headCorrection: z.number().min(0).optional(),
  /** a seepage flow above this is an alarm, m3/s */
  maxFlow: z.number().positive(),
  baseline: z.strictObject({
    zeroFlowPool: z.number(),
    referencePool: z.number(),
    referenceFlow: z.number().positive(),
    exponent: z.number().positive(),
    lagHours: z.number().min(0),
    /** flow above baseline x (1 + tolerance) + toleranceFlow is "rising against the baseline" */
    tolerance: z.number().min(0),
    toleranceFlow: z.number().min(0),
  }),
});
export type SeepageWeir = z.infer<typeof seepageWeirSchema>;

/**
 * A foundation piezometer. Baseline: the level keeps `ratio` of the head between the (lagged) pool
 * and the downstream level the foundation drains to.
 */
export const piezometerSchema = z.strictObject({
  id: idSchema,
  label: z.string().min(1).max(80),
  channel: channelIdSchema,
  location: z.string().min(1).max(160),
  /** a piezometric level above this is an alarm, m */
  maxLevel: z.number(),
  baseline: z.strictObject({
    downstreamLevel: z.number(),
    ratio: z.number().min(0).max(1),
    lagHours: z.number().min(0),
  }),
});
export type Piezometer = z.infer<typeof piezometerSchema>;

export const reservoirDefinitionSchema = z
  .strictObject({
    id: idSchema,
    name: z.string().min(1).max(120),
    damName: z.string().min(1).max(120),
    owner: z.string().min(1).max(120),
    river: z.string().min(1).max(120),
    /** IANA zone the site's times are shown in */
    timeZone: z.string().min(1),
    riverbedElevation: z.number(),
    damCrestElevation: z.number(),
    normalMaxPool: z.number(),
    requiredFreeboard: z.number().min(0),
    storageTable: z.array(storageRowSchema).min(2),
    structures: z.array(structureSchema).min(1),
    thresholds: z.array(thresholdSchema),
    channels: z.array(channelDefinitionSchema).min(1),
    /** pool gauges in order of preference */
    poolChannels: z.array(channelIdSchema).min(1),
    seepageWeirs: z.array(seepageWeirSchema).optional(),
    piezometers: z.array(piezometerSchema).optional(),
    /** alarm limits; absent sections take the defaults (docs/alarms.md) */
    alarms: alarmLimitsSchema.optional(),
  })
  .superRefine((def, ctx) => {
    const ids = new Set(def.channels.map((c) => c.id));
    def.poolChannels.forEach((id, i) => {
      if (!ids.has(id))
        ctx.addIssue({ code: 'custom', path: ['poolChannels', i], message: `no channel "${id}"` });
    });
    def.channels.forEach((c, i) => {
      if (c.min >= c.max)
        ctx.addIssue({
          code: 'custom',
          path: ['channels', i, 'max'],
          message: 'max must exceed min',
        });
    });
    const roleOf = new Map(def.channels.map((c) => [c.id, c.role]));
    const needRole = (path: (string | number)[], id: string, role: ChannelRole) => {
      if (roleOf.get(id) !== role)
        ctx.addIssue({
          code: 'custom',
          path,
          message: `needs a "${role}" channel, "${id}" is not one`,
        });
    };
    def.seepageWeirs?.forEach((w, i) => {
      needRole(['seepageWeirs', i, 'channel'], w.channel, 'seepage-weir-head');
      const is90 = Math.abs(w.notchAngleDeg - 90) < 1e-9;
      if (!is90 && (w.dischargeCoefficient === undefined || w.headCorrection === undefined))
        ctx.addIssue({
          code: 'custom',
          path: ['seepageWeirs', i, 'dischargeCoefficient'],
          message:
            'a notch other than 90 degrees needs its discharge coefficient and head correction',
        });
      if (w.baseline.referencePool <= w.baseline.zeroFlowPool)
        ctx.addIssue({
          code: 'custom',
          path: ['seepageWeirs', i, 'baseline', 'referencePool'],
          message: 'must be above zeroFlowPool',
        });
    });
    def.piezometers?.forEach((p, i) =>
      needRole(['piezometers', i, 'channel'], p.channel, 'piezometer'),
    );
    const thresholdIds = new Set(def.thresholds.map((t) => t.id));
    def.alarms?.poolLevels?.forEach((a, i) => {
      if (!thresholdIds.has(a.thresholdId))
        ctx.addIssue({
          code: 'custom',
          path: ['alarms', 'poolLevels', i, 'thresholdId'],
          message: `no threshold "${a.thresholdId}"`,
        });
    });
    def.alarms?.forecast?.thresholds.forEach((id, i) => {
      if (!thresholdIds.has(id))
        ctx.addIssue({
          code: 'custom',
          path: ['alarms', 'forecast', 'thresholds', i],
          message: `no threshold "${id}"`,
        });
    });
    def.alarms?.frozen?.forEach((f, i) => {
      if (!ids.has(f.channel))
        ctx.addIssue({
          code: 'custom',
          path: ['alarms', 'frozen', i, 'channel'],
          message: `no channel "${f.channel}"`,
        });
    });
    const instrumentIds = [...(def.seepageWeirs ?? []), ...(def.piezometers ?? [])].map(
      (x) => x.id,
    );
    if (new Set(instrumentIds).size !== instrumentIds.length)
      ctx.addIssue({
        code: 'custom',
        path: ['seepageWeirs'],
        message: 'weir and piezometer ids must be unique',
      });
    if (def.damCrestElevation <= def.normalMaxPool) {
      ctx.addIssue({
        code: 'custom',
        path: ['damCrestElevation'],
        message: 'must be above the normal maximum pool',
      });
    }
  });
export type ReservoirDefinition = z.infer<typeof reservoirDefinitionSchema>;
