import { describe, expect, it } from 'vitest';
import { parseHydrographCsv, splitCsvLine } from './csv.js';

describe('parseHydrographCsv', () => {
  it('reads a clean file (hours), skipping blank and comment lines', () => {
    const text = '# storm of record\ntime,flow\n0,10\n\n1,25.5\n2,1e2\n';
    const r = parseHydrographCsv(text, { timeUnit: 'h' });
    expect(r.problems).toEqual([]);
    expect(r.points).toEqual([
      { t: 0, q: 10 },
      { t: 3600, q: 25.5 },
      { t: 7200, q: 100 },
    ]);
  });
  it('reports a non-numeric flow with its row and column', () => {
    const text = ['time,flow', '0,1', '60,2', '120,3', '180,4', '240,5', '300,abc', '360,7'].join(
      '\n',
    );
    const r = parseHydrographCsv(text);
    expect(r.problems).toEqual([
      { row: 7, column: 'flow', message: `row 7, column 'flow': not a number ("abc")` },
    ]);
    expect(r.points).toHaveLength(6);
  });
  it('reports negative flows, times out of order, wrong column counts and empty fields', () => {
    const text = ['t;q;note', '0;1;a', '60;-2;b', '30;3;c', '90;4', '120;;d', 'x;5;e'].join('\n');
    const msgs = parseHydrographCsv(text).problems.map((p) => p.message);
    expect(msgs).toEqual([
      "row 3, column 'q': must not be negative (-2)",
      "row 4, column 't': must be after row 3 (60)",
      'row 5: expected 3 columns, found 2',
      "row 6, column 'q': empty",
      `row 7, column 't': not a number or an ISO 8601 date-time with an offset ("x")`,
    ]);
  });
  it('reads ISO 8601 times with offsets as epoch seconds and rejects mixing kinds', () => {
    const r = parseHydrographCsv(
      'time,flow\n2025-01-01T00:00Z,1\n2025-01-01T01:00+01:00,2\n2025-01-01T02:00:00Z,3\n',
    );
    expect(r.problems.map((p) => p.message)).toEqual([
      "row 3, column 'time': must be after row 2 (2025-01-01T00:00Z)",
    ]);
    expect(r.points[0]!.t).toBe(Date.UTC(2025, 0, 1) / 1000);
    const mixed = parseHydrographCsv('time,flow\n2025-01-01T00:00Z,1\n3600,2\n');
    expect(mixed.problems[0]!.message).toContain('a number ("3600") among date-times');
  });
  it('names missing columns and empty files', () => {
    expect(parseHydrographCsv('when,how much\n1,2').problems[0]!.message).toBe(
      "row 1: no time column 'time' (columns: when, how much)",
    );
    expect(parseHydrographCsv('date,flow\n1,2', { timeColumn: 'date' }).points).toEqual([
      { t: 1, q: 2 },
    ]);
    expect(parseHydrographCsv('  \n').problems[0]!.message).toContain('the file is empty');
    expect(parseHydrographCsv('time,flow\n').problems[0]!.message).toBe(
      'row 1: no data rows after the header',
    );
  });
  it('caps the list of problems and counts the rest', () => {
    const text = ['time,flow', ...Array.from({ length: 80 }, (_, i) => `${i},x`)].join('\n');
    const r = parseHydrographCsv(text, { maxProblems: 10 });
    expect(r.problems).toHaveLength(11);
    expect(r.problems[10]!.message).toBe('70 more problem(s) not listed');
  });
  it('splits quoted fields with doubled quotes', () => {
    expect(splitCsvLine('"a, b",2,"say ""hi"""', ',')).toEqual(['a, b', '2', 'say "hi"']);
  });
});
