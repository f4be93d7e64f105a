import { Injectable, type PipeTransform } from '@nestjs/common';
import type { z } from 'zod';
import type { OrderErrorCode } from '@stillwell/shared/orders';
import { describeIssues } from '@stillwell/shared/telemetry';
import { OrderError } from './order-error';

/**
 * Checks a body against its shared zod schema: the gateway and the console read the same rules,
 * and a refusal names every field at fault ("steps.0.targets.1.target: ...").
 */
@Injectable()
export class ZodBodyPipe<S extends z.ZodType> implements PipeTransform<unknown, z.output<S>> {
  constructor(
    private readonly schema: S,
    private readonly code: OrderErrorCode = 'invalid-order',
  ) {}

  transform(value: unknown): z.output<S> {
    const parsed = this.schema.safeParse(value ?? {});
    if (!parsed.success) throw new OrderError(this.code, describeIssues(parsed.error));
    return parsed.data;
  }
}
