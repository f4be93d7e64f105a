import type { z } from 'zod';
import { compileOutflow } from '@stillwell/shared/hydraulics';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { UploadProblem } from './storage-csv';

/** A zod path as people write it: structures[0].gates[1].width */
export function pathText(path: readonly PropertyKey[]): string {
  return path
    .map((p, i) => (typeof p === 'number' ? `[${p}]` : `${i ? '.' : ''}${String(p)}`))
    .join('');
}

const problem = (
  field: string,
  message: string,
  severity: UploadProblem['severity'] = 'error',
): UploadProblem => ({
  field,
  row: 0,
  line: null,
  column: null,
  message: `${field}: ${message}`,
  severity,
});

export function zodProblems(error: z.ZodError): UploadProblem[] {
  return error.issues.map((i) => problem(pathText(i.path) || '(body)', i.message));
}

/**
 * What the schema cannot see: every gate and valve must be reported by a channel of the right
 * role (the forecast reads its opening there), ids must be unique, the structures must compile.
 * Warnings for a definition that works but leaves the forecast blind somewhere.
 */
export function checkDefinition(def: ReservoirDefinition): UploadProblem[] {
  const out: UploadProblem[] = [];
  const channelRole = new Map(def.channels.map((c) => [c.id, c.role]));
  const needRole = (field: string, channel: string, role: string) => {
    const found = channelRole.get(channel);
    if (found !== role)
      out.push(
        problem(
          field,
          found
            ? `channel "${channel}" has role ${found}, not ${role}`
            : `no channel "${channel}" in the definition (a ${role} channel must report it)`,
        ),
      );
  };
  const seen = new Map<string, string>();
  const unique = (field: string, id: string) => {
    const first = seen.get(id);
    if (first) out.push(problem(field, `id "${id}" is already used by ${first}`));
    else seen.set(id, field);
  };
  def.structures.forEach((s, i) => {
    unique(`structures[${i}].id`, s.id);
    if (s.kind === 'gated-spillway')
      s.gates.forEach((g, j) => {
        unique(`structures[${i}].gates[${j}].id`, g.id);
        needRole(`structures[${i}].gates[${j}].channel`, g.channel, 'gate-opening');
      });
    if (s.kind === 'low-level-outlet')
      needRole(`structures[${i}].valveChannel`, s.valveChannel, 'valve-opening');
  });
  const thresholdIds = new Map<string, number>();
  def.thresholds.forEach((t, i) => {
    const first = thresholdIds.get(t.id);
    if (first !== undefined)
      out.push(problem(`thresholds[${i}].id`, `id "${t.id}" repeats thresholds[${first}]`));
    else thresholdIds.set(t.id, i);
  });
  if (out.length === 0) {
    try {
      compileOutflow(def.structures);
    } catch (error) {
      out.push(problem('structures', (error as Error).message));
    }
  }
  const top = def.storageTable[def.storageTable.length - 1]?.elevation ?? -Infinity;
  if (top < def.damCrestElevation)
    out.push(
      problem(
        'storageTable',
        `the table ends at ${top} m, below the dam crest ${def.damCrestElevation} m: forecasts stop where it ends`,
        'warning',
      ),
    );
  def.thresholds.forEach((t, i) => {
    if (t.elevation > top)
      out.push(
        problem(
          `thresholds[${i}].elevation`,
          `${t.elevation} m is above the top of the storage table (${top} m): a forecast cannot reach it`,
          'warning',
        ),
      );
  });
  return out;
}
