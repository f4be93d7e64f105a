import { splitCsvLine, validateStorageTable, type StorageRow } from '@stillwell/shared/hydraulics';

/** One problem with an uploaded table: the data row (from 1), the line of the file, the column. */
export interface UploadProblem {
  field: string;
  row: number;
  line: number | null;
  column: string | null;
  message: string;
  severity: 'error' | 'warning';
}

export interface ParsedStorageTable {
  rows: StorageRow[];
  problems: UploadProblem[];
}

const FIELD = 'storageTable';
const COLUMNS = ['elevation', 'area', 'storage'] as const;
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
/** a table of a few hundred rows is plenty; this bounds the work of one upload */
export const MAX_STORAGE_ROWS = 5000;

/**
 * The elevation-area-storage table as CSV: a header naming the columns elevation, area and
 * storage (any order, any case; separator ',', ';' or tab as the header shows), then one row per
 * elevation in SI (m, m2, m3). Blank lines and lines starting with '#' are skipped. Rows are
 * numbered from the first data row, as in the table checks ("storageTable row 4 (elevation):
 * must be above row 3 (200 m)"), and each problem carries the line of the file as well.
 */
export function parseStorageTableCsv(text: string): ParsedStorageTable {
  const problems: UploadProblem[] = [];
  const err = (row: number, line: number | null, column: string | null, message: string) =>
    problems.push({
      field: FIELD,
      row,
      line,
      column,
      message: `${FIELD} row ${row}${column ? ` (${column})` : ''}: ${message}`,
      severity: 'error',
    });
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const data = (l: string) => l.trim() !== '' && !l.trimStart().startsWith('#');
  const headerIdx = lines.findIndex(data);
  if (headerIdx < 0) {
    problems.push({
      field: FIELD,
      row: 0,
      line: null,
      column: null,
      message: `${FIELD}: the file is empty (expected a header "elevation,area,storage")`,
      severity: 'error',
    });
    return { rows: [], problems };
  }
  const headerLine = lines[headerIdx]!;
  const sep = [',', ';', '\t'].reduce(
    (best, s) => (headerLine.split(s).length > headerLine.split(best).length ? s : best),
    ',',
  );
  const header = splitCsvLine(headerLine, sep).map((h) => h.toLowerCase());
  const index = COLUMNS.map((c) => header.indexOf(c));
  const absent = COLUMNS.filter((_, i) => index[i]! < 0);
  if (absent.length) {
    problems.push({
      field: FIELD,
      row: 0,
      line: headerIdx + 1,
      column: null,
      message: `${FIELD} header (line ${headerIdx + 1}): no column ${absent.map((c) => `'${c}'`).join(', ')} (found: ${header.join(', ')}); expected elevation,area,storage`,
      severity: 'error',
    });
    return { rows: [], problems };
  }
  const rows: StorageRow[] = [];
  const lineOf: number[] = [];
  let row = 0;
  let broken = false;
  for (let li = headerIdx + 1; li < lines.length; li++) {
    if (!data(lines[li]!)) continue;
    row++;
    if (row > MAX_STORAGE_ROWS) {
      err(row, li + 1, null, `the table has more than ${MAX_STORAGE_ROWS} rows`);
      return { rows: [], problems };
    }
    const fields = splitCsvLine(lines[li]!, sep);
    if (fields.length !== header.length) {
      err(
        row,
        li + 1,
        null,
        `expected ${header.length} columns, found ${fields.length} (line ${li + 1})`,
      );
      broken = true;
      continue;
    }
    const values = COLUMNS.map((c, i) => {
      const raw = fields[index[i]!]!;
      if (raw === '') err(row, li + 1, c, `empty (line ${li + 1})`);
      else if (!NUMBER.test(raw)) err(row, li + 1, c, `not a number ("${raw}", line ${li + 1})`);
      else return Number(raw);
      return NaN;
    });
    if (values.some((v) => Number.isNaN(v))) {
      broken = true;
      continue;
    }
    rows.push({ elevation: values[0]!, area: values[1]!, storage: values[2]! });
    lineOf.push(li + 1);
  }
  // the table checks number rows the same way, so only run them on a table read completely
  if (!broken) {
    for (const p of validateStorageTable(rows)) {
      problems.push({
        field: FIELD,
        row: p.row,
        line: lineOf[p.row - 1] ?? null,
        column: p.field === 'table' ? null : p.field,
        message: `${FIELD} ${p.message}`,
        severity: p.severity,
      });
    }
  }
  return { rows: broken ? [] : rows, problems };
}
