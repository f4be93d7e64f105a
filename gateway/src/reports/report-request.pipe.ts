import { BadRequestException, Injectable, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';
import { describeIssues } from '@stillwell/shared/telemetry';

/**
 * Checks a body or query against its shared zod schema; a refusal is a 400 whose message names
 * every field at fault ("from: must be before to").
 */
@Injectable()
export class ZodPipe<S extends z.ZodType> implements PipeTransform<unknown, z.output<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.output<S> {
    const parsed = this.schema.safeParse(value ?? {});
    if (!parsed.success) throw new BadRequestException(describeIssues(parsed.error));
    return parsed.data;
  }
}
