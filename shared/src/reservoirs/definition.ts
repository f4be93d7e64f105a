import { z } from 'zod';
import { channelIdSchema, idSchema } from '../telemetry/message.js';
import { storageRowSchema, structureSchema } from '../hydraulics/schema.js';
import { UNITS } from '../units/units.js';

/** What a channel measures, so that the gateway knows which one is the pool, the inflow, ... */
export const CHANNEL_ROLES = [
  'pool',
  'inflow',
  'outflow',
  'rain',
  'gate-opening',
  'valve-opening',
  'tailwater',
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
    if (def.damCrestElevation <= def.normalMaxPool) {
      ctx.addIssue({
        code: 'custom',
        path: ['damCrestElevation'],
        message: 'must be above the normal maximum pool',
      });
    }
  });
export type ReservoirDefinition = z.infer<typeof reservoirDefinitionSchema>;
