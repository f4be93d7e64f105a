import { z } from 'zod';
import {
  checkFlowRows,
  checkScheduleRows,
  compareRequestSchema,
  WHAT_IF_LIMITS,
  type CompareRequest,
  type FlowRow,
  type ScheduleControl,
  type ScheduleRow,
  type TableProblem,
} from '@stillwell/shared/forecasts';
import { hoursToSeconds, type HydrographRow, type ScheduleDraft } from './what-if-tables';

/** Where a problem belongs on the page: a field, or a row (and column) of one of the tables. */
export type ProblemField =
  | 'inflow'
  | 'scheduleA'
  | 'scheduleB'
  | 'labelA'
  | 'labelB'
  | 'startElevation'
  | 'durationS'
  | 'general';

export interface FormProblem {
  field: ProblemField;
  /** from 1, the table's row, when the problem is in a row */
  row?: number;
  /** the request's column name: t, q (inflow) or time, id, target (schedules) */
  column?: string;
  message: string;
}

export type StartGates = 'current' | 'closed';

/** Everything the page's form holds. Text fields stay text until they are checked. */
export interface WhatIfValues {
  hydrograph: HydrographRow[];
  a: ScheduleDraft;
  b: ScheduleDraft;
  /** m; '' for the current pool */
  startElevation: string;
  /** h; '' for the hydrograph's length, at least 24 h */
  durationH: string;
  startGates: StartGates;
}

export interface RequestContext {
  controls: readonly ScheduleControl[];
  /** the storage table's range, m: a start outside it cannot be routed */
  storageRange: readonly [number, number];
}

const MIN_H = WHAT_IF_LIMITS.minDurationS / 3600;
const MAX_H = WHAT_IF_LIMITS.maxDurationS / 3600;

/** An optional number typed in a text field: '' is "not given". */
const optionalNumber = (what: string) =>
  z
    .string()
    .trim()
    .refine((s) => s === '' || Number.isFinite(Number(s)), `${what}: must be a number`)
    .transform((s) => (s === '' ? undefined : Number(s)));

/** The form's own fields; the tables are checked by the shared row checks beside it. */
export function fieldsSchema([low, high]: readonly [number, number]) {
  const label = (which: string) =>
    z
      .string()
      .trim()
      .min(1, `Name schedule ${which}`)
      .max(80, `Schedule ${which}'s name: at most 80 characters`);
  return z.object({
    labelA: label('A'),
    labelB: label('B'),
    startElevation: optionalNumber('Start elevation').refine(
      (v) => v === undefined || (v >= low && v <= high),
      `Start elevation: outside the storage table (${low} to ${high} m)`,
    ),
    durationS: optionalNumber('Run length')
      .refine(
        (v) => v === undefined || (v >= MIN_H && v <= MAX_H),
        `Run length: from ${MIN_H * 60} min to ${MAX_H} h`,
      )
      .transform((v) => (v === undefined ? undefined : Math.round(v * 3600))),
  });
}

const FIELDS: readonly ProblemField[] = [
  'inflow',
  'scheduleA',
  'scheduleB',
  'labelA',
  'labelB',
  'startElevation',
  'durationS',
];
const asField = (name: unknown): ProblemField =>
  FIELDS.includes(name as ProblemField) ? (name as ProblemField) : 'general';

const fromTable = (p: TableProblem): FormProblem => ({
  field: asField(p.field),
  row: p.row > 0 ? p.row : undefined,
  column: p.column,
  message: p.message,
});

const flowRowsOf = (rows: readonly HydrographRow[]) =>
  rows.map((r) => ({ t: r.hour === null ? null : hoursToSeconds(r.hour), q: r.flow }));

const scheduleRowsOf = (draft: ScheduleDraft) =>
  draft.rows.map((r) => ({
    time: r.hour === null ? null : hoursToSeconds(r.hour),
    id: r.control,
    target: r.target,
  }));

/**
 * The comparison request the form stands for, or every problem that keeps it from being sent:
 * the fields by the form's zod schema, the tables by the shared row checks (the gateway's own), and
 * the whole by the shared request schema. Messages name the field and row as the gateway's do.
 */
export function buildCompareRequest(
  values: WhatIfValues,
  context: RequestContext,
): { request: CompareRequest | null; problems: FormProblem[] } {
  const problems: FormProblem[] = [];
  const fields = fieldsSchema(context.storageRange).safeParse({
    labelA: values.a.name,
    labelB: values.b.name,
    startElevation: values.startElevation,
    durationS: values.durationH,
  });
  if (!fields.success) {
    for (const issue of fields.error.issues)
      problems.push({ field: asField(issue.path[0]), message: issue.message });
  }
  const inflow = flowRowsOf(values.hydrograph);
  const scheduleA = scheduleRowsOf(values.a);
  const scheduleB = scheduleRowsOf(values.b);
  problems.push(
    ...checkFlowRows(inflow, 'inflow').map(fromTable),
    ...checkScheduleRows(scheduleA, 'scheduleA', context.controls).map(fromTable),
    ...checkScheduleRows(scheduleB, 'scheduleB', context.controls).map(fromTable),
  );
  if (problems.length > 0 || !fields.success) return { request: null, problems };

  const request: CompareRequest = {
    inflow: inflow as FlowRow[],
    labelA: fields.data.labelA,
    scheduleA: scheduleA as ScheduleRow[],
    labelB: fields.data.labelB,
    scheduleB: scheduleB as ScheduleRow[],
    ...(fields.data.startElevation !== undefined && {
      startElevation: fields.data.startElevation,
    }),
    ...(fields.data.durationS !== undefined && { durationS: fields.data.durationS }),
    // a gate or valve not listed is closed at the start
    ...(values.startGates === 'closed' && { initialOpenings: [] }),
  };
  const checked = compareRequestSchema.safeParse(request);
  if (!checked.success) {
    return {
      request: null,
      problems: checked.error.issues.map((issue) => ({
        field: asField(issue.path[0]),
        row: typeof issue.path[1] === 'number' ? issue.path[1] + 1 : undefined,
        message: `${issue.path.join('.')}: ${issue.message}`,
      })),
    };
  }
  return { request: checked.data, problems: [] };
}

const PROBLEM =
  /^(inflowCsv|inflow|scheduleA|scheduleB|schedule|initialOpenings|startElevation|durationS|dtS|labelA|labelB|inflowTimeUnit)(?: row (\d+))?(?: \(([^)]+)\)|, column '([^']*)')?(?=[: ]|$)/;

/**
 * A gateway 400's lines as problems on the page. A table's problems come joined in one line
 * ("inflow row 3 (t): ...; inflow row 4 (q): ..."), so lines are split where the next problem
 * starts; each is placed by the field, row and column it names, anything else is general.
 */
export function problemsFromApi(details: readonly string[]): FormProblem[] {
  const lines = details.flatMap((d) => d.split(/; (?=[A-Za-z]+ row \d+|\d+ more problem)/));
  return lines.map((message) => {
    const m = PROBLEM.exec(message);
    if (!m) return { field: 'general', message };
    const [, name, row, column, csvColumn] = m;
    // rows of an uploaded file are counted as its lines: not the grid's rows
    if (name === 'inflowCsv') return { field: 'inflow', message };
    return {
      field: asField(name),
      row: row ? Number(row) : undefined,
      column: column ?? csvColumn,
      message,
    };
  });
}

/** The part of a row's message after "scheduleA row 3 (target): ", for a cell beside the row. */
export function rowMessage(problem: FormProblem, columnLabels: Record<string, string>): string {
  const rest = problem.message.replace(/^\S+ row \d+(?: \([^)]*\))?: /, '');
  const column = problem.column ? (columnLabels[problem.column] ?? problem.column) : null;
  return column ? `${column}: ${rest}` : rest;
}

export const problemsOf = (problems: readonly FormProblem[], field: ProblemField) =>
  problems.filter((p) => p.field === field);
