import { z } from 'zod';
import { reservoirDefinitionSchema } from './definition.js';

/** GET /api/reservoirs/:id: the definition in force and its version. */
export const reservoirResponseSchema = z.strictObject({
  version: z.number().int(),
  definition: reservoirDefinitionSchema,
});
export type ReservoirResponse = z.infer<typeof reservoirResponseSchema>;
