import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { parseStorageTableCsv } from './storage-csv';

const demoCsv = [
  'elevation,area,storage',
  ...DEMO_RESERVOIR.storageTable.map((r) => `${r.elevation},${r.area},${r.storage}`),
].join('\n');

describe('parseStorageTableCsv', () => {
  it('reads the demo table back exactly, whatever the column order and separator', () => {
    expect(parseStorageTableCsv(demoCsv)).toEqual({
      rows: DEMO_RESERVOIR.storageTable,
      problems: [],
    });
    const reordered = [
      '# Lake Orrin, surveyed 2026',
      'Storage;Elevation;Area',
      '',
      '0;171;0',
      '8000;173;12000',
    ].join('\r\n');
    expect(parseStorageTableCsv(reordered).rows).toEqual([
      { elevation: 171, area: 0, storage: 0 },
      { elevation: 173, area: 12000, storage: 8000 },
    ]);
  });

  it('names the row, the column and the line of what cannot be read', () => {
    const { rows, problems } = parseStorageTableCsv(
      'elevation,area,storage\n171,0,0\n173,abc,8000\n\n175,44000\n178,,310000\n',
    );
    expect(rows).toEqual([]);
    expect(problems.map((p) => p.message)).toEqual([
      'storageTable row 2 (area): not a number ("abc", line 3)',
      'storageTable row 3: expected 3 columns, found 2 (line 5)',
      'storageTable row 4 (area): empty (line 6)',
    ]);
    expect(problems[1]).toMatchObject({ row: 3, line: 5, column: null });
  });

  it('passes on the table checks with the same row numbers', () => {
    const { problems } = parseStorageTableCsv(
      'elevation,area,storage\n198,1727000,15967000\n199,1852000,17756000\n200,1981000,19672000\n200,2114000,21719000\n',
    );
    expect(problems.filter((p) => p.severity === 'error').map((p) => p.message)).toEqual([
      'storageTable row 4 (elevation): must be above row 3 (200 m)',
    ]);
    expect(problems[0]).toMatchObject({ row: 4, line: 5, column: 'elevation' });
  });

  it('says which header columns are missing', () => {
    expect(parseStorageTableCsv('level,area,volume\n1,2,3')['problems'][0]?.message).toBe(
      "storageTable header (line 1): no column 'elevation', 'storage' (found: level, area, volume); expected elevation,area,storage",
    );
    expect(parseStorageTableCsv('\n# nothing\n').problems[0]?.message).toContain('empty');
  });
});
