import { BadRequestException, type PipeTransform } from '@nestjs/common';
import {
  fieldPath,
  limitsChangeSchema,
  type LimitsChange,
  type LimitsProblem,
} from '@stillwell/shared/reservoirs';

/**
 * The 400 of a refused limits change, as the definition uploads answer: each problem as a line
 * naming its field ("seepageWeirs[0].maxFlow: ..."), and the same as data for the console's form.
 */
export function refuseLimits(problems: LimitsProblem[]): never {
  throw new BadRequestException({
    statusCode: 400,
    error: 'Bad Request',
    message: problems.slice(0, 50).map((p) => `${p.field}: ${p.message}`),
    problems: problems.slice(0, 200),
  });
}

/** Checks the body against the shared schema the console's form uses too. */
export class LimitsChangePipe implements PipeTransform<unknown, LimitsChange> {
  transform(value: unknown): LimitsChange {
    const parsed = limitsChangeSchema.safeParse(value ?? {});
    if (parsed.success) return parsed.data;
    return refuseLimits(
      parsed.error.issues.map((i) => ({
        field: fieldPath(i.path) || '(body)',
        message: i.message,
      })),
    );
  }
}
