import { BadRequestException, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';

/**
 * Checks a body against the shared zod schema the console uses too, so both sides refuse the same
 * thing with the same words. Each message names its field: "travelTimes.2.releaseM3s: must be ...".
 */
export class ZodBody<S extends z.ZodType> implements PipeTransform<unknown, z.output<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.output<S> {
    const result = this.schema.safeParse(value);
    if (result.success) return result.data;
    throw new BadRequestException(
      result.error.issues.map(
        (i) => `${i.path.length ? i.path.join('.') : '(body)'}: ${i.message}`,
      ),
    );
  }
}
