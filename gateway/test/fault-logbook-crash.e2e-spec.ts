import Database from 'better-sqlite3';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  freePort,
  startBrokerProcess,
  startGatewayProcess,
  verifyLogbook,
  waitFor,
  type Child,
} from './support/processes';

jest.setTimeout(240_000);

async function signIn(url: string, password: string): Promise<string> {
  const res = await fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ username: 'operator', password }),
  });
  if (res.status !== 200) throw new Error(`sign-in: ${res.status}`);
  return ((await res.json()) as { accessToken: string }).accessToken;
}

describe('fault: the gateway is SIGKILLed while it appends to the logbook', () => {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-logcrash-'));
  const databasePath = join(dir, 'stillwell.sqlite');
  const running: Child[] = [];

  afterAll(async () => {
    for (const c of running.reverse()) await c.stop('SIGTERM');
    rmSync(dir, { recursive: true, force: true });
  });

  it('keeps every acknowledged entry and a chain that verifies', async () => {
    const brokerPort = await freePort();
    running.push(await startBrokerProcess(brokerPort));
    const env = {
      port: await freePort(),
      databasePath,
      mqttUrl: `mqtt://127.0.0.1:${brokerPort}`,
      clientId: `stillwell-logcrash-${process.pid}`,
    };
    const first = await startGatewayProcess(env);
    running.push(first.child);
    const token = await signIn(first.url, first.password('operator'));

    // four writers at once, each note acknowledged (2xx) or not; the kill lands mid-write
    const acknowledged = new Map<string, number>();
    let failures = 0;
    let stop = false;
    const writer = async (w: number) => {
      for (let i = 0; !stop; i++) {
        const text = `crash note ${w}-${i}`;
        const form = new FormData();
        form.set('text', text);
        try {
          const res = await fetch(`${first.url}/api/logbook/shift-notes`, {
            method: 'POST',
            headers: { authorization: `Bearer ${token}` },
            body: form,
          });
          if (res.status >= 200 && res.status < 300) {
            acknowledged.set(text, ((await res.json()) as { seq: number }).seq);
          } else failures++;
        } catch {
          failures++;
        }
      }
    };
    const writers = [0, 1, 2, 3].map(writer);
    await waitFor(
      'forty notes acknowledged',
      () => {
        if (acknowledged.size < 40) throw new Error(`${acknowledged.size}`);
      },
      60_000,
      20,
    );
    first.child.signal('SIGKILL');
    await first.child.exited;
    stop = true;
    await Promise.all(writers);
    expect(first.child.child.signalCode).toBe('SIGKILL');
    // requests cut off by the kill were refused or never answered: they are not acknowledged
    expect(failures).toBeGreaterThan(0);

    const second = await startGatewayProcess(env);
    running.push(second.child);
    const report = await verifyLogbook(second.url, second.password('operator'));
    expect(report).toMatchObject({ ok: true });

    const db = new Database(databasePath, { readonly: true });
    try {
      const notes = db
        .prepare(`SELECT seq, payload FROM logbook_entries WHERE kind = 'shift.note'`)
        .all() as Array<{ seq: number; payload: string }>;
      const bySeq = new Map(notes.map((n) => [n.seq, n.payload]));
      const missing = [...acknowledged].filter(([text, seq]) => !bySeq.get(seq)?.includes(text));
      expect(missing).toEqual([]);
      expect(notes.length).toBeGreaterThanOrEqual(acknowledged.size);
      console.log(
        `${acknowledged.size} notes acknowledged, ${notes.length} stored, ${failures} cut off; chain of ${report.count} verifies`,
      );
    } finally {
      db.close();
    }
  });
});
