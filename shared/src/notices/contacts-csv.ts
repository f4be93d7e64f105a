import { splitCsvLine, type CsvProblem } from '../hydraulics/csv.js';
import { contactInputSchema, type ContactInput } from './contacts.js';

export type { CsvProblem };

/** A contact as a CSV row gives it: the zone and the sign-in by name, for the gateway to resolve. */
export type ContactCsvRow = Omit<ContactInput, 'zoneId' | 'userId'> & {
  zoneName: string;
  username: string | null;
};

export interface ContactsCsv {
  rows: Array<{ row: number; contact: ContactCsvRow }>;
  problems: CsvProblem[];
}

/** The columns of a contacts file; times are in minutes because that is how people think of them. */
export const CONTACT_CSV_COLUMNS = [
  'zone',
  'organisation',
  'person',
  'role',
  'email',
  'phone',
  'lead_time_min',
  'escalation_order',
  'ack_window_min',
  'username',
  'active',
] as const;
type Column = (typeof CONTACT_CSV_COLUMNS)[number];
const OPTIONAL: ReadonlySet<Column> = new Set(['username', 'active', 'ack_window_min']);

const WHOLE = /^\d+$/;
const YES = ['yes', 'y', 'true', '1'];
const NO = ['no', 'n', 'false', '0'];

/** The message for one field, checked by the same schema the API uses. */
function fieldProblem(field: keyof typeof contactInputSchema.shape, value: unknown): string | null {
  const result = contactInputSchema.shape[field].safeParse(value);
  return result.success ? null : (result.error.issues[0]?.message ?? 'not valid');
}

/**
 * A contacts CSV: a header row naming the columns (any order, case-insensitive), then one contact
 * per row. Rows are counted as lines of the file (the header is row 1; blank lines and '#' lines are
 * skipped but counted), so "row 4" is the fourth line the person sees in their spreadsheet or editor.
 * Separator ',', ';' or tab, detected from the header. Every problem is listed, not just the first.
 */
export function parseContactsCsv(text: string): ContactsCsv {
  const problems: CsvProblem[] = [];
  const add = (row: number, column: string | undefined, message: string) =>
    problems.push({
      row,
      column,
      message: `row ${row}${column ? `, column '${column}'` : ''}: ${message}`,
    });
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const headerIdx = lines.findIndex((l) => l.trim() !== '' && !l.trimStart().startsWith('#'));
  if (headerIdx < 0) {
    add(
      1,
      undefined,
      `the file is empty (expected a header row: ${CONTACT_CSV_COLUMNS.join(',')})`,
    );
    return { rows: [], problems };
  }
  const headerLine = lines[headerIdx]!;
  const sep = [',', ';', '\t'].reduce(
    (best, s) => (headerLine.split(s).length > headerLine.split(best).length ? s : best),
    ',',
  );
  const header = splitCsvLine(headerLine, sep).map((h) => h.toLowerCase());
  const index = new Map<Column, number>();
  header.forEach((h, i) => {
    if ((CONTACT_CSV_COLUMNS as readonly string[]).includes(h)) index.set(h as Column, i);
    else add(headerIdx + 1, h, `unknown column (columns: ${CONTACT_CSV_COLUMNS.join(', ')})`);
  });
  for (const c of CONTACT_CSV_COLUMNS) {
    if (!OPTIONAL.has(c) && !index.has(c)) add(headerIdx + 1, c, 'missing from the header');
  }
  if (problems.length) return { rows: [], problems };

  const rows: ContactsCsv['rows'] = [];
  const seen = new Map<string, number>();
  for (let li = headerIdx + 1; li < lines.length; li++) {
    const line = lines[li]!;
    if (line.trim() === '' || line.trimStart().startsWith('#')) continue;
    const row = li + 1;
    const before = problems.length;
    const fields = splitCsvLine(line, sep);
    if (fields.length !== header.length) {
      add(row, undefined, `expected ${header.length} columns, found ${fields.length}`);
      continue;
    }
    const get = (c: Column) => {
      const i = index.get(c);
      return i === undefined ? '' : fields[i]!;
    };
    const text = (c: Column, field: 'organisation' | 'person' | 'role' | 'email' | 'phone') => {
      const problem = fieldProblem(field, get(c));
      if (problem) add(row, c, get(c) === '' ? 'required' : `${problem} ("${get(c)}")`);
      return get(c).trim();
    };
    const whole = (c: Column, fallback: number | null, scale: number) => {
      const raw = get(c);
      if (raw === '' && fallback !== null) return fallback * scale;
      if (raw === '') add(row, c, 'required');
      else if (!WHOLE.test(raw)) add(row, c, `not a whole number ("${raw}")`);
      return Number(raw) * scale;
    };
    const zoneName = get('zone').trim();
    if (!zoneName) add(row, 'zone', 'required');
    const organisation = text('organisation', 'organisation');
    const person = text('person', 'person');
    const role = text('role', 'role');
    const email = text('email', 'email');
    const phone = text('phone', 'phone');
    const leadTimeS = whole('lead_time_min', null, 60);
    const escalationOrder = whole('escalation_order', null, 1);
    const ackWindowS = whole('ack_window_min', 30, 60);
    for (const [c, field, value] of [
      ['lead_time_min', 'leadTimeS', leadTimeS],
      ['escalation_order', 'escalationOrder', escalationOrder],
      ['ack_window_min', 'ackWindowS', ackWindowS],
    ] as const) {
      const problem = Number.isFinite(value) ? fieldProblem(field, value) : null;
      if (problem) add(row, c, `${problem} ("${get(c)}")`);
    }
    const activeRaw = get('active').trim().toLowerCase();
    if (activeRaw && !YES.includes(activeRaw) && !NO.includes(activeRaw)) {
      add(row, 'active', `not yes or no ("${get('active')}")`);
    }
    const key = `${zoneName.toLowerCase()}|${email.toLowerCase()}`;
    const earlier = seen.get(key);
    if (earlier !== undefined && zoneName && email) {
      add(row, 'email', `the same zone and e-mail as row ${earlier}`);
    }
    if (problems.length > before) continue;
    seen.set(key, row);
    rows.push({
      row,
      contact: {
        zoneName,
        organisation,
        person,
        role,
        email,
        phone,
        leadTimeS,
        escalationOrder,
        ackWindowS,
        username: get('username').trim() || null,
        active: !NO.includes(activeRaw),
      },
    });
  }
  if (rows.length === 0 && problems.length === 0)
    add(headerIdx + 1, undefined, 'no contacts after the header');
  return { rows, problems };
}
