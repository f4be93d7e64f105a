import type { FlowPoint } from './inflow-series.js';

/**
 * User hydrograph CSV: a header row naming the columns, then one row per point. Rows are counted
 * as lines of the file (the header is row 1; blank lines and lines starting with '#' are skipped
 * but counted). Separator: ',', ';' or tab, detected from the header. Fields may be quoted ("").
 * Times: numbers in `timeUnit` (s, min or h), or ISO 8601 date-times with an offset (Z or +hh:mm),
 * read as seconds since 1970-01-01T00:00Z; one kind per file. Flows: m3/s, not negative.
 */
export interface HydrographCsvOptions {
  /** header of the time column (default: the first of time, t, time_s, hour, hours) */
  timeColumn?: string;
  /** header of the flow column (default: the first of flow, q, inflow, discharge) */
  flowColumn?: string;
  timeUnit?: 's' | 'min' | 'h';
  /** stop listing problems after this many (default 50) */
  maxProblems?: number;
}

export interface CsvProblem {
  row: number;
  column?: string;
  message: string;
}

export interface HydrographCsv {
  points: FlowPoint[];
  problems: CsvProblem[];
}

const TIME_NAMES = ['time', 't', 'time_s', 'hour', 'hours'];
const FLOW_NAMES = ['flow', 'q', 'inflow', 'discharge'];
const UNIT_S = { s: 1, min: 60, h: 3600 } as const;
const ISO = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/;
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Splits one line into fields (RFC 4180 quoting within the line). */
export function splitCsvLine(line: string, sep: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (c === '"') quoted = false;
      else cur += c;
    } else if (c === '"' && cur.trim() === '') {
      quoted = true;
      cur = '';
    } else if (c === sep) {
      out.push(cur.trim());
      cur = '';
    } else cur += c;
  }
  out.push(cur.trim());
  return out;
}

export function parseHydrographCsv(
  text: string,
  options: HydrographCsvOptions = {},
): HydrographCsv {
  const problems: CsvProblem[] = [];
  const max = options.maxProblems ?? 50;
  let found = 0;
  const add = (row: number, column: string | undefined, message: string) => {
    found++;
    if (problems.length < max) {
      problems.push({
        row,
        column,
        message: `row ${row}${column ? `, column '${column}'` : ''}: ${message}`,
      });
    }
  };
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const headerIdx = lines.findIndex((l) => l.trim() !== '' && !l.trimStart().startsWith('#'));
  if (headerIdx < 0) {
    add(1, undefined, 'the file is empty (expected a header row such as "time,flow")');
    return { points: [], problems };
  }
  const headerLine = lines[headerIdx]!;
  const sep = [',', ';', '\t'].reduce(
    (best, s) => (headerLine.split(s).length > headerLine.split(best).length ? s : best),
    ',',
  );
  const header = splitCsvLine(headerLine, sep);
  const lower = header.map((h) => h.toLowerCase());
  const find = (wanted: string | undefined, names: string[], what: string) => {
    const i =
      wanted !== undefined
        ? lower.indexOf(wanted.toLowerCase())
        : lower.findIndex((h) => names.includes(h));
    if (i < 0) {
      const name = wanted ?? names[0]!;
      add(headerIdx + 1, undefined, `no ${what} column '${name}' (columns: ${header.join(', ')})`);
    }
    return i;
  };
  const ti = find(options.timeColumn, TIME_NAMES, 'time');
  const qi = find(options.flowColumn, FLOW_NAMES, 'flow');
  if (ti < 0 || qi < 0) return { points: [], problems };
  const tName = header[ti]!;
  const qName = header[qi]!;
  const scale = UNIT_S[options.timeUnit ?? 's'];
  const points: FlowPoint[] = [];
  let kind: 'number' | 'iso' | undefined;
  let prev: { row: number; t: number; raw: string } | undefined;
  for (let li = headerIdx + 1; li < lines.length; li++) {
    const line = lines[li]!;
    if (line.trim() === '' || line.trimStart().startsWith('#')) continue;
    const row = li + 1;
    const before = found;
    const fields = splitCsvLine(line, sep);
    if (fields.length !== header.length) {
      add(row, undefined, `expected ${header.length} columns, found ${fields.length}`);
      continue;
    }
    const rawT = fields[ti]!;
    const rawQ = fields[qi]!;
    let t = NaN;
    if (NUMBER.test(rawT)) {
      if (kind === 'iso') add(row, tName, `a number ("${rawT}") among date-times`);
      else {
        kind = 'number';
        t = Number(rawT) * scale;
      }
    } else if (ISO.test(rawT)) {
      if (kind === 'number') add(row, tName, `a date-time ("${rawT}") among numbers`);
      else {
        kind = 'iso';
        t = Date.parse(rawT.replace(' ', 'T')) / 1000;
        if (Number.isNaN(t)) add(row, tName, `not a valid date-time ("${rawT}")`);
      }
    } else if (rawT === '') add(row, tName, 'empty');
    else add(row, tName, `not a number or an ISO 8601 date-time with an offset ("${rawT}")`);
    let q = NaN;
    if (rawQ === '') add(row, qName, 'empty');
    else if (!NUMBER.test(rawQ)) add(row, qName, `not a number ("${rawQ}")`);
    else {
      q = Number(rawQ);
      if (q < 0) add(row, qName, `must not be negative (${rawQ})`);
      else if (!Number.isFinite(q)) add(row, qName, `out of range (${rawQ})`);
    }
    if (Number.isFinite(t) && prev && !(t > prev.t)) {
      add(row, tName, `must be after row ${prev.row} (${prev.raw})`);
    }
    if (found > before) {
      if (Number.isFinite(t) && (!prev || t > prev.t)) prev = { row, t, raw: rawT };
      continue;
    }
    prev = { row, t, raw: rawT };
    points.push({ t, q });
  }
  if (found > problems.length) {
    problems.push({
      row: lines.length,
      message: `${found - problems.length} more problem(s) not listed`,
    });
  }
  if (points.length === 0 && problems.length === 0)
    add(headerIdx + 1, undefined, 'no data rows after the header');
  return { points, problems };
}
