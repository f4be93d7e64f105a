/**
 * Row checks for the tables a person types or uploads for a what-if: an inflow hydrograph and a
 * gate schedule. The gateway's DTOs and the console's forms run the same checks, so a table the
 * console accepts is one the gateway accepts. Rows count from 1 (the first data row), and every
 * message names the field, the row and the column: "inflow row 4 (t): must be after row 3 (3600 s)".
 */
export interface TableProblem {
  field: string;
  row: number;
  column?: string;
  message: string;
}

/** Upper bounds that keep one request's work small (a week at one-minute points). */
export const TABLE_LIMITS = { flowRows: 20_000, scheduleRows: 500 } as const;

/** An operable gate or valve as a schedule row may name it. */
export interface ScheduleControl {
  id: string;
  kind: 'gate' | 'valve';
  /** m for gates, % for valves */
  max: number;
}

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

const fmt = (v: number) => String(Number(v.toPrecision(10)));

function problemAdder(field: string, out: TableProblem[]) {
  return (row: number, column: string | undefined, message: string) =>
    out.push({
      field,
      row,
      column,
      message: `${field} row ${row}${column ? ` (${column})` : ''}: ${message}`,
    });
}

function checkKeys(
  value: Record<string, unknown>,
  allowed: readonly string[],
  row: number,
  add: ReturnType<typeof problemAdder>,
): void {
  for (const key of Object.keys(value)) {
    if (!allowed.includes(key)) add(row, key, `unknown column (expected ${allowed.join(', ')})`);
  }
}

function finiteNumber(
  value: unknown,
  row: number,
  column: string,
  add: ReturnType<typeof problemAdder>,
): number | null {
  if (value === undefined || value === null || value === '') {
    add(row, column, 'empty');
    return null;
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    add(row, column, `must be a finite number (${JSON.stringify(value)})`);
    return null;
  }
  return value;
}

/**
 * An inflow hydrograph: rows { t, q }, t in seconds from the start of the run (not negative,
 * strictly increasing), q in m3/s (not negative).
 */
export function checkFlowRows(rows: unknown, field = 'inflow'): TableProblem[] {
  const out: TableProblem[] = [];
  const add = problemAdder(field, out);
  if (!Array.isArray(rows)) {
    out.push({ field, row: 0, message: `${field}: must be a list of rows { t, q }` });
    return out;
  }
  if (rows.length === 0) {
    out.push({ field, row: 0, message: `${field}: needs at least one row` });
    return out;
  }
  if (rows.length > TABLE_LIMITS.flowRows) {
    out.push({
      field,
      row: TABLE_LIMITS.flowRows + 1,
      message: `${field}: at most ${TABLE_LIMITS.flowRows} rows (${rows.length} given)`,
    });
    return out;
  }
  let previous: { row: number; t: number } | null = null;
  rows.forEach((value: unknown, i) => {
    const row = i + 1;
    if (!isRecord(value)) {
      add(row, undefined, 'must be a row { t, q }');
      return;
    }
    checkKeys(value, ['t', 'q'], row, add);
    const t = finiteNumber(value.t, row, 't', add);
    const q = finiteNumber(value.q, row, 'q', add);
    if (q !== null && q < 0) add(row, 'q', `must not be negative (${fmt(q)} m3/s)`);
    if (t === null) return;
    if (t < 0) add(row, 't', `must not be negative (${fmt(t)} s)`);
    if (previous && !(t > previous.t))
      add(row, 't', `must be after row ${previous.row} (${fmt(previous.t)} s)`);
    if (!previous || t > previous.t) previous = { row, t };
  });
  return out;
}

/**
 * A gate schedule: rows { time, id, target }, time in seconds from the start (not negative),
 * target in m (gate) or % (valve). With the reservoir's controls, ids and ranges are checked too.
 */
export function checkScheduleRows(
  rows: unknown,
  field = 'schedule',
  controls?: readonly ScheduleControl[],
): TableProblem[] {
  const out: TableProblem[] = [];
  const add = problemAdder(field, out);
  if (!Array.isArray(rows)) {
    out.push({ field, row: 0, message: `${field}: must be a list of rows { time, id, target }` });
    return out;
  }
  if (rows.length > TABLE_LIMITS.scheduleRows) {
    out.push({
      field,
      row: TABLE_LIMITS.scheduleRows + 1,
      message: `${field}: at most ${TABLE_LIMITS.scheduleRows} rows (${rows.length} given)`,
    });
    return out;
  }
  rows.forEach((value: unknown, i) => {
    const row = i + 1;
    if (!isRecord(value)) {
      add(row, undefined, 'must be a row { time, id, target }');
      return;
    }
    checkKeys(value, ['time', 'id', 'target'], row, add);
    const time = finiteNumber(value.time, row, 'time', add);
    if (time !== null && time < 0) add(row, 'time', `must not be negative (${fmt(time)} s)`);
    const target = finiteNumber(value.target, row, 'target', add);
    if (target !== null && target < 0) add(row, 'target', `must not be negative (${fmt(target)})`);
    if (typeof value.id !== 'string' || value.id.trim() === '') {
      add(row, 'id', 'name a gate or valve');
      return;
    }
    if (!controls) return;
    const control = controls.find((c) => c.id === value.id);
    if (!control) {
      add(
        row,
        'id',
        `no gate or valve "${value.id}" (there are: ${controls.map((c) => c.id).join(', ')})`,
      );
      return;
    }
    const unit = control.kind === 'gate' ? 'm' : '%';
    if (target !== null && target > control.max)
      add(
        row,
        'target',
        `${fmt(target)} ${unit} is above the largest opening ${control.max} ${unit}`,
      );
  });
  return out;
}

/** The problems as the lines of a 400 answer, at most `max` of them and a count of the rest. */
export function problemLines(problems: readonly TableProblem[], max = 20): string[] {
  const lines = problems.slice(0, max).map((p) => p.message);
  if (problems.length > max) lines.push(`${problems.length - max} more problem(s) not listed`);
  return lines;
}
