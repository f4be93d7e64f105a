import { canonicalize } from 'json-canonicalize';
import { hashEntry } from '@stillwell/shared/logbook';
import { csvField, csvLine } from './logbook-csv';

/** A tiny RFC 4180 reader: enough to read back what csvLine writes. */
function parseLine(line: string): string[] {
  const out: string[] = [];
  let i = 0;
  while (i < line.length) {
    if (line[i] !== '"') throw new Error(`unquoted field at ${i}`);
    let v = '';
    i += 1;
    for (;;) {
      if (line[i] === '"' && line[i + 1] === '"') {
        v += '"';
        i += 2;
      } else if (line[i] === '"') break;
      else v += line[i++];
    }
    out.push(v);
    i += 2; // the closing quote and the comma
  }
  return out;
}

describe('logbook CSV', () => {
  it('quotes, doubles quotes and defuses formulas', () => {
    expect(csvField('plain')).toBe('"plain"');
    expect(csvField('say "stop"')).toBe('"say ""stop"""');
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('-1+2')).toBe(`"'-1+2"`);
    expect(csvField('@SUM(A1)')).toBe(`"'@SUM(A1)"`);
  });

  it('writes the canonical payload, so every hash can be recomputed from the file', async () => {
    const body = {
      seq: 12,
      time: '2030-01-01T12:00:00.000Z',
      actorId: 'u1',
      actorName: 'operator',
      actorRoles: ['operator'],
      kind: 'shift.note',
      payload: { text: 'gate 2 "sticky", =cmd', controls: ['gate-2'] },
      prevHash: 'a'.repeat(64),
    };
    const entry = { ...body, hash: await hashEntry(body) };
    const [seq, time, kind, actor, roles, controls, payload, prev, hash] = parseLine(
      csvLine(entry).trimEnd(),
    );
    expect([seq, time, kind, actor, roles, controls]).toEqual([
      '12',
      body.time,
      'shift.note',
      'operator',
      'operator',
      'gate-2',
    ]);
    expect(payload).toBe(canonicalize(body.payload));
    const recomputed = await hashEntry({
      ...body,
      payload: JSON.parse(payload!) as Record<string, unknown>,
      prevHash: prev!,
    });
    expect(recomputed).toBe(hash);
  });
});
