import { createWriteStream } from 'node:fs';
import { once } from 'node:events';
import type { ReadingsSource, RawReadingRow } from './readings-source';

export const READINGS_CSV_HEADER = [
  'channel',
  'device_id',
  'seq',
  'time',
  'time_ms',
  'value',
  'quality',
  'received_at',
] as const;

/** One reading as a CSV line (RFC 4180: CRLF; only channel and device ids are text). */
export function readingCsvLine(r: RawReadingRow): string {
  const text = (s: string) => (/[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  return `${text(r.channel)},${text(r.device_id)},${r.seq},${new Date(r.time).toISOString()},${r.time},${r.value},${r.quality},${new Date(r.received_at).toISOString()}\r\n`;
}

const CHUNK_ROWS = 5000;

/**
 * Writes every reading of the window to a file, channel by channel, oldest first. Rows are read
 * lazily and written in chunks that wait for the file to drain, so a large export never sits in
 * memory; between chunks the event loop serves other requests. Resolves to the rows written.
 */
export async function writeReadingsCsv(
  source: ReadingsSource,
  q: { reservoirId: string; channels: readonly string[]; from: number; to: number },
  path: string,
  onRows: (done: number) => void = () => undefined,
): Promise<number> {
  const out = createWriteStream(path, { encoding: 'utf8' });
  const failed = once(out, 'error').then(([e]) => Promise.reject(e as Error));
  failed.catch(() => undefined);
  const write = async (chunk: string) => {
    if (!out.write(chunk)) await Promise.race([once(out, 'drain'), failed]);
  };
  await write(READINGS_CSV_HEADER.join(',') + '\r\n');
  let done = 0;
  for (const channel of q.channels) {
    let lines: string[] = [];
    for (const r of source.rows(q.reservoirId, channel, q.from, q.to)) {
      lines.push(readingCsvLine(r));
      if (lines.length === CHUNK_ROWS) {
        await write(lines.join(''));
        done += lines.length;
        lines = [];
        onRows(done);
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    if (lines.length) {
      await write(lines.join(''));
      done += lines.length;
      onRows(done);
    }
  }
  out.end();
  await Promise.race([once(out, 'finish'), failed]);
  return done;
}
