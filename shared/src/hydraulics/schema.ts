import { z } from 'zod';
import { channelIdSchema, idSchema } from '../telemetry/message.js';

/**
 * The reservoir's hydraulic definition: elevation-area-storage table and outflow structures.
 * All values SI: elevations in m above datum, areas in m2, storages in m3, flows in m3/s,
 * weir coefficients in m^0.5/s (Q = C L H^1.5).
 */
export const storageRowSchema = z.strictObject({
  elevation: z.number().min(-500).max(9000),
  area: z.number().min(0),
  storage: z.number().min(0),
});
export type StorageRow = z.infer<typeof storageRowSchema>;

export const gateSchema = z.strictObject({
  id: idSchema,
  /** telemetry channel reporting this gate's opening, m */
  channel: channelIdSchema,
  type: z.enum(['radial', 'vertical-lift']),
  width: z.number().positive(),
  /** fully open, m above the sill */
  maxOpening: z.number().positive(),
  /** orifice discharge coefficient under the gate lip (about 0.6-0.75 for radial gates) */
  orificeCoefficient: z.number().positive().max(1),
  /** gate travel speed, m/s of opening */
  travelSpeed: z.number().positive(),
});
export type Gate = z.infer<typeof gateSchema>;

const structureBase = {
  id: idSchema,
  name: z.string().min(1).max(120),
};

/** Uncontrolled ogee crest: Q = C Le H^1.5. */
export const ogeeCrestSchema = z.strictObject({
  ...structureBase,
  kind: z.literal('ogee-crest'),
  crestElevation: z.number(),
  effectiveLength: z.number().positive(),
  coefficient: z.number().positive().max(3),
});

/** Broad-crested weir (for example an auxiliary spillway): Q = C L H^1.5. */
export const broadCrestedWeirSchema = z.strictObject({
  ...structureBase,
  kind: z.literal('broad-crested-weir'),
  crestElevation: z.number(),
  length: z.number().positive(),
  coefficient: z.number().positive().max(3),
});

/** Ogee crest divided into bays, each closed by a gate. */
export const gatedSpillwaySchema = z.strictObject({
  ...structureBase,
  kind: z.literal('gated-spillway'),
  crestElevation: z.number(),
  /** free-weir coefficient of the crest with the gates clear of the water */
  coefficient: z.number().positive().max(3),
  gates: z.array(gateSchema).min(1).max(32),
});

/** Low-level outlet conduit with a valve at its downstream end. */
export const lowLevelOutletSchema = z.strictObject({
  ...structureBase,
  kind: z.literal('low-level-outlet'),
  /** channel reporting the valve opening, % */
  valveChannel: channelIdSchema,
  diameter: z.number().positive(),
  length: z.number().positive(),
  /** elevation of the conduit's outlet centreline, m */
  outletElevation: z.number(),
  /** Darcy-Weisbach friction factor */
  frictionFactor: z.number().positive().max(0.2),
  entranceLossCoefficient: z.number().min(0),
  /** valve loss coefficient when fully open */
  valveLossCoefficient: z.number().min(0),
  /** largest valve change per second, % */
  travelSpeed: z.number().positive(),
});

/**
 * Any structure rated by a table of pool elevation against discharge. Interpolated by a monotone
 * cubic (PCHIP) unless `interpolation` is 'linear'; 0 below the first row, whose discharge must be 0.
 */
export const ratingTableSchema = z.strictObject({
  ...structureBase,
  kind: z.literal('rating-table'),
  interpolation: z.enum(['monotone-cubic', 'linear']).optional(),
  rows: z.array(z.strictObject({ elevation: z.number(), discharge: z.number().min(0) })).min(2),
});

export const structureSchema = z.discriminatedUnion('kind', [
  ogeeCrestSchema,
  broadCrestedWeirSchema,
  gatedSpillwaySchema,
  lowLevelOutletSchema,
  ratingTableSchema,
]);
export type Structure = z.infer<typeof structureSchema>;
export type OgeeCrest = z.infer<typeof ogeeCrestSchema>;
export type BroadCrestedWeir = z.infer<typeof broadCrestedWeirSchema>;
export type GatedSpillway = z.infer<typeof gatedSpillwaySchema>;
export type LowLevelOutlet = z.infer<typeof lowLevelOutletSchema>;
export type RatingTable = z.infer<typeof ratingTableSchema>;
