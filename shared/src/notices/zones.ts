import { z } from 'zod';

/** What kind of place a zone is; the console groups and labels by it. */
export const ZONE_KINDS = ['hamlet', 'work-site', 'town', 'campground', 'other'] as const;
export const zoneKindSchema = z.enum(ZONE_KINDS);
export type ZoneKind = z.infer<typeof zoneKindSchema>;

/** One row of an engineer's travel-time table: a release and how long its flood wave takes to arrive. */
export const travelTimeRowSchema = z.strictObject({
  /** release from the dam, m3/s */
  releaseM3s: z.number().positive().max(100_000),
  /** from the start of the release at the dam to the rise reaching the zone, s */
  travelTimeS: z
    .number()
    .positive()
    .max(7 * 86_400),
});
export type TravelTimeRow = z.infer<typeof travelTimeRowSchema>;

export const travelTimeTableSchema = z
  .array(travelTimeRowSchema)
  .min(1, 'at least one row')
  .max(50)
  .superRefine((rows, ctx) => {
    // interpolation needs releases in strictly ascending order; say which row breaks it
    rows.forEach((row, i) => {
      const above = rows[i - 1];
      if (above && row.releaseM3s <= above.releaseM3s) {
        ctx.addIssue({
          code: 'custom',
          path: [i, 'releaseM3s'],
          message: `must be greater than the row above (${above.releaseM3s} m3/s)`,
        });
      }
    });
  });

const zoneFields = {
  name: z.string().trim().min(1, 'required').max(120),
  kind: zoneKindSchema,
  /** along the river from the dam, m */
  distanceM: z.number().positive().max(1_000_000),
  /** the release at and above which the zone is affected, m3/s */
  affectedAtM3s: z.number().positive().max(100_000),
  travelTimes: travelTimeTableSchema,
};

/** POST and PUT /api/reservoirs/:id/zones body. */
export const zoneInputSchema = z.strictObject(zoneFields);
export type ZoneInput = z.infer<typeof zoneInputSchema>;

export const zoneSchema = z.strictObject({
  ...zoneFields,
  id: z.string().min(1),
  reservoirId: z.string().min(1),
  /** active contacts in the zone */
  contactCount: z.number().int().min(0),
  updatedAt: z.number(),
});
export type Zone = z.infer<typeof zoneSchema>;
export const zoneListSchema = z.array(zoneSchema);
