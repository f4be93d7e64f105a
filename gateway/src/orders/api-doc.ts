import { ApiBody } from '@nestjs/swagger';
import { z } from 'zod';

/** The request body in the API document, generated from the same shared zod schema that checks it. */
export function ZodApiBody(schema: z.ZodType, description?: string): MethodDecorator {
  const json = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as Record<
    string,
    unknown
  >;
  delete json.$schema;
  return ApiBody({ schema: json, description } as Parameters<typeof ApiBody>[0]);
}
