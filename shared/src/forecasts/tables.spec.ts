import { describe, expect, it } from 'vitest';
import { checkFlowRows, checkScheduleRows, problemLines } from './tables.js';

const controls = [
  { id: 'gate-1', kind: 'gate' as const, max: 9 },
  { id: 'low-level-outlet', kind: 'valve' as const, max: 100 },
];

describe('checkFlowRows', () => {
  it('accepts a sound hydrograph', () => {
    expect(
      checkFlowRows([
        { t: 0, q: 50 },
        { t: 3600, q: 80 },
      ]),
    ).toEqual([]);
  });

  it('names the field, the row (from 1) and the column of every problem', () => {
    const messages = checkFlowRows(
      [
        { t: 0, q: 50 },
        { t: 3600, q: 80 },
        { t: 3600, q: -2 },
        { t: 'soon', q: 10 },
        { t: 7200 },
        { t: 9000, q: 1, extra: true },
      ],
      'inflow.points',
    ).map((p) => p.message);
    expect(messages).toEqual([
      'inflow.points row 3 (q): must not be negative (-2 m3/s)',
      'inflow.points row 3 (t): must be after row 2 (3600 s)',
      'inflow.points row 4 (t): must be a finite number ("soon")',
      'inflow.points row 5 (q): empty',
      'inflow.points row 6 (extra): unknown column (expected t, q)',
    ]);
  });

  it('refuses an empty table and a table that is not a list', () => {
    expect(checkFlowRows([])[0]?.message).toBe('inflow: needs at least one row');
    expect(checkFlowRows('0,50')[0]?.message).toContain('must be a list');
  });
});

describe('checkScheduleRows', () => {
  it('checks the shape without the reservoir, and ids and ranges with it', () => {
    const rows = [
      { time: 0, id: 'gate-1', target: 3 },
      { time: -5, id: 'gate-1', target: 12 },
      { time: 60, id: 'gate-9', target: 1 },
      { time: 60, id: '', target: 1 },
      { time: 120, id: 'low-level-outlet', target: 101 },
    ];
    expect(checkScheduleRows(rows).map((p) => p.message)).toEqual([
      'schedule row 2 (time): must not be negative (-5 s)',
      'schedule row 4 (id): name a gate or valve',
    ]);
    expect(checkScheduleRows(rows, 'a.schedule', controls).map((p) => p.message)).toEqual([
      'a.schedule row 2 (time): must not be negative (-5 s)',
      'a.schedule row 2 (target): 12 m is above the largest opening 9 m',
      'a.schedule row 3 (id): no gate or valve "gate-9" (there are: gate-1, low-level-outlet)',
      'a.schedule row 4 (id): name a gate or valve',
      'a.schedule row 5 (target): 101 % is above the largest opening 100 %',
    ]);
  });

  it('lists at most so many problems, then counts the rest', () => {
    const many = Array.from({ length: 30 }, () => ({ time: -1, id: 'gate-1', target: 0 }));
    const lines = problemLines(checkScheduleRows(many), 20);
    expect(lines).toHaveLength(21);
    expect(lines[20]).toBe('10 more problem(s) not listed');
  });
});
