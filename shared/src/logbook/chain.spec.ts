import { canonicalize } from 'json-canonicalize';
import { describe, expect, it } from 'vitest';
import {
  GENESIS_HASH,
  canonicalEntry,
  hashEntry,
  sha256Hex,
  verifyEntries,
  type LogbookEntryRecord,
} from './chain.js';

// RFC 8785 (JSON Canonicalization Scheme). The main example (sections 3.2.2 to 3.2.4) and its
// UTF-8 output in hexadecimal were read from a faithful reproduction of the RFC (the gowebpki/jcs
// README); the property-sorting example (section 3.2.3) and the number serialisations of
// Appendix B are recalled from memory of the RFC text, unconfirmed. They pass against the library,
// which they would not by chance.
describe('canonical JSON after RFC 8785', () => {
  it('reproduces the RFC main example (section 3.2.3)', () => {
    const input = JSON.parse(
      '{"numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001],' +
        '"string": "\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/",' +
        '"literals": [null, true, false]}',
    );
    expect(canonicalize(input)).toBe(
      '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],' +
        '"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}',
    );
  });
  it('gives the RFC main example as the exact UTF-8 bytes of section 3.2.4', () => {
    const input = JSON.parse(
      '{"numbers": [333333333.33333329, 1E30, 4.50, 2e-3, 0.000000000000000000000000001],' +
        '"string": "\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/",' +
        '"literals": [null, true, false]}',
    );
    const rfcHex =
      '7b 22 6c 69 74 65 72 61 6c 73 22 3a 5b 6e 75 6c 6c 2c 74 72 75 65 2c 66 61 6c 73 65 5d 2c 22 6e ' +
      '75 6d 62 65 72 73 22 3a 5b 33 33 33 33 33 33 33 33 33 2e 33 33 33 33 33 33 33 2c 31 65 2b 33 30 ' +
      '2c 34 2e 35 2c 30 2e 30 30 32 2c 31 65 2d 32 37 5d 2c 22 73 74 72 69 6e 67 22 3a 22 e2 82 ac 24 ' +
      '5c 75 30 30 30 66 5c 6e 41 27 42 5c 22 5c 5c 5c 5c 5c 22 2f 22 7d';
    const bytes = [...new TextEncoder().encode(canonicalize(input))];
    expect(bytes.map((b) => b.toString(16).padStart(2, '0')).join(' ')).toBe(rfcHex);
  });
  it('sorts properties by UTF-16 code units (section 3.2.3)', () => {
    const input = JSON.parse(
      '{"\\u20ac": "Euro Sign", "\\r": "Carriage Return", "\\ufb33": "Hebrew Letter Dalet With Dagesh",' +
        '"1": "One", "\\ud83d\\ude00": "Emoji: Grinning Face", "\\u0080": "Control",' +
        '"\\u00f6": "Latin Small Letter O With Diaeresis"}',
    );
    // read the keys from the text: Object.keys would put the integer-like "1" first
    const keys = [...canonicalize(input).matchAll(/"((?:[^"\\]|\\.)*)":/g)].map((m) =>
      JSON.parse(`"${m[1]}"`),
    );
    expect(keys).toEqual(['\r', '1', '\u0080', '\u00f6', '\u20ac', '\ud83d\ude00', '\ufb33']);
  });
  it.each([
    [0, '0'],
    [-0, '0'],
    [5e-324, '5e-324'],
    [1.7976931348623157e308, '1.7976931348623157e+308'],
    [9007199254740992, '9007199254740992'],
    [1e21, '1e+21'],
    [0.000001, '0.000001'],
    [333333333.3333333, '333333333.3333333'],
  ])('serialises the number %s as %s (Appendix B)', (n, text) => {
    expect(canonicalize(n)).toBe(text);
  });
});

describe('SHA-256', () => {
  // FIPS 180-2 Appendix B.1 test vector: SHA-256("abc")
  it('matches the FIPS 180-2 "abc" vector', async () => {
    expect(await sha256Hex('abc')).toBe(
      'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
    );
  });
});

describe('logbook chain', () => {
  async function chain(n: number): Promise<LogbookEntryRecord[]> {
    const out: LogbookEntryRecord[] = [];
    let prevHash = GENESIS_HASH;
    for (let seq = 1; seq <= n; seq += 1) {
      const body = {
        seq,
        time: new Date(Date.UTC(2026, 11, 1, 12, seq)).toISOString(),
        actorId: 'u1',
        actorName: 'mara.ostby',
        actorRoles: ['operator'],
        kind: 'shift.note',
        payload: { text: `entry ${seq}`, nested: { b: 2, a: [1, 'x'] } },
        prevHash,
      };
      const hash = await hashEntry(body);
      out.push({ ...body, hash });
      prevHash = hash;
    }
    return out;
  }

  it('hashes the canonical form, independent of property order', async () => {
    const [e] = await chain(1);
    const reordered = { ...e!, payload: { nested: { a: [1, 'x'], b: 2 }, text: 'entry 1' } };
    expect(canonicalEntry(reordered)).toBe(canonicalEntry(e!));
    expect(await hashEntry(reordered)).toBe(e!.hash);
  });

  it('verifies an intact chain and reports its head', async () => {
    const entries = await chain(5);
    expect(await verifyEntries(entries)).toEqual({
      ok: true,
      count: 5,
      headSeq: 5,
      headHash: entries[4]!.hash,
    });
  });

  it('names the first changed entry', async () => {
    const entries = await chain(5);
    entries[2] = { ...entries[2]!, payload: { text: 'entry 3, quietly edited' } };
    const verdict = await verifyEntries(entries);
    expect(verdict.ok).toBe(false);
    expect(verdict.firstBad).toMatchObject({ seq: 3, problem: 'hash-mismatch' });
    expect(verdict.headSeq).toBe(2);
  });

  it('finds a removed entry', async () => {
    const entries = await chain(5);
    entries.splice(1, 1);
    expect((await verifyEntries(entries)).firstBad).toMatchObject({
      seq: 3,
      problem: 'missing-entries',
    });
  });

  it('finds an entry rewritten with a fresh hash: the next link breaks', async () => {
    const entries = await chain(4);
    const forged = { ...entries[1]!, payload: { text: 'forged' } };
    entries[1] = { ...forged, hash: await hashEntry(forged) };
    expect((await verifyEntries(entries)).firstBad).toMatchObject({
      seq: 3,
      problem: 'broken-link',
    });
  });

  it('continues from a page boundary', async () => {
    const entries = await chain(6);
    const first = await verifyEntries(entries.slice(0, 3));
    const second = await verifyEntries(entries.slice(3), {
      seq: first.headSeq!,
      hash: first.headHash!,
    });
    expect(second).toMatchObject({ ok: true, count: 3, headSeq: 6 });
  });
});
