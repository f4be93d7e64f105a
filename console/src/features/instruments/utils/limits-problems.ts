import { ApiError } from '../../../lib/api-client';
import type { LimitsProblem } from '@stillwell/shared/reservoirs';
import type { LimitField } from './limit-fields';

/** Messages by form key (a limit's key, or "note"), and those that belong to no one field. */
export interface PlacedProblems {
  fields: Record<string, string>;
  general: string[];
}

const PATH_FIRST = /^([A-Za-z][\w-]*(?:\[\d+\]|\.[\w-]+)*|\(body\)): (.+)$/s;

/**
 * The fields a gateway 400 names: its `problems` list where it sends one, otherwise each
 * "path: message" line of its message.
 */
export function problemsOfError(error: unknown): LimitsProblem[] {
  if (!(error instanceof ApiError)) return [];
  const body = error.body as { problems?: unknown } | undefined;
  if (Array.isArray(body?.problems)) {
    const listed = body.problems.flatMap((p: unknown) => {
      const { field, message } = (p ?? {}) as { field?: unknown; message?: unknown };
      return typeof field === 'string' && typeof message === 'string'
        ? [{ field, message: withoutPath(field, message) }]
        : [];
    });
    if (listed.length) return listed;
  }
  return error.details.map((line) => {
    const m = PATH_FIRST.exec(line);
    return m ? { field: m[1]!, message: m[2]! } : { field: '(body)', message: line };
  });
}

function withoutPath(field: string, message: string): string {
  return message.startsWith(`${field}: `) ? message.slice(field.length + 2) : message;
}

/** Puts each problem beside the field it names; the rest go above the form. */
export function placeProblems(
  fields: readonly LimitField[],
  problems: readonly LimitsProblem[],
): PlacedProblems {
  const byPath = new Map(fields.flatMap((f) => f.paths.map((p) => [p, f.key] as const)));
  const placed: PlacedProblems = { fields: {}, general: [] };
  for (const p of problems) {
    const key = p.field === 'note' ? 'note' : byPath.get(p.field);
    if (key) placed.fields[key] ??= p.message;
    else placed.general.push(p.field === '(body)' ? p.message : `${p.field}: ${p.message}`);
  }
  return placed;
}
