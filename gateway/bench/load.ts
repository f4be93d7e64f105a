// Load benchmark (not a test): 5 reservoirs x 50 channels at 1 Hz through MQTT, 200 console clients
// on socket.io, for LOAD_SECONDS on loopback. Reports readings lost (stored count), publish-to-screen
// latency and the gateway's resident memory (sampled each second, shown each 10 s).
// `node --import tsx bench/load.ts [--json]`.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { connectAsync, type MqttClient } from 'mqtt';
import { io, type Socket } from 'socket.io-client';
import { DEMO_RESERVOIR, type ReservoirDefinition } from '@stillwell/shared/reservoirs';
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  telemetryTopic,
  type Reading,
} from '@stillwell/shared/telemetry';

const RESERVOIRS = 5;
const CHANNELS = 50;
const CLIENTS = Number(process.env.LOAD_CLIENTS ?? 200);
// long enough for the gateway's heap to pass its first full collections (about 100 s under this load)
const SECONDS = Number(process.env.LOAD_SECONDS ?? 180);
const json = process.argv.includes('--json');
const here = import.meta.dirname;

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

function startProcess(args: string[], env: Record<string, string>, ready: RegExp) {
  const child = spawn(process.execPath, args, {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  return new Promise<{ child: ChildProcess; out: () => string }>((resolve, reject) => {
    const onData = (d: Buffer) => {
      out += d.toString();
      if (ready.test(out)) resolve({ child, out: () => out });
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => reject(new Error(`exited ${code}: ${out.slice(-2000)}`)));
  });
}
const stop = (c: ChildProcess) =>
  new Promise<void>((r) => {
    if (c.exitCode !== null) return r();
    c.once('exit', () => r());
    c.kill('SIGTERM');
  });

const BROKER = `import net from 'node:net'; import { Aedes } from 'aedes';
const b = await Aedes.createBroker(); const s = net.createServer(b.handle);
s.listen(Number(process.env.P), '127.0.0.1', () => console.log('broker ready'));`;

/** The demo reservoir under another id, its channel list filled up to CHANNELS with piezometers. */
function definitionOf(i: number): ReservoirDefinition {
  const piezo = DEMO_RESERVOIR.channels.find((c) => c.role === 'piezometer')!;
  const extra = Array.from({ length: CHANNELS - DEMO_RESERVOIR.channels.length }, (_, k) => ({
    ...piezo,
    id: `load.piezometer.${k + 1}`,
    deviceId: `load-logger-${k + 1}`,
    label: `Load piezometer ${k + 1}`,
  }));
  return {
    ...DEMO_RESERVOIR,
    id: i === 0 ? DEMO_RESERVOIR.id : `load-reservoir-${i}`,
    name: i === 0 ? DEMO_RESERVOIR.name : `Load reservoir ${i}`,
    channels: [...DEMO_RESERVOIR.channels, ...extra],
  };
}

/** The seed: every reservoir's definition written as its gateway writes it (a new current version). */
function seed(file: string, defs: ReservoirDefinition[]): void {
  const db = new Database(file);
  const put = db.transaction(() => {
    for (const d of defs) {
      const row = db
        .prepare(`SELECT current_version AS v FROM reservoirs WHERE id = ?`)
        .get(d.id) as { v: number } | undefined;
      const version = (row?.v ?? 0) + 1;
      db.prepare(
        `INSERT INTO reservoir_versions (reservoir_id, version, definition, created_at, created_by, change, note)
         VALUES (?, ?, ?, ?, 'load-bench', 'seed', 'load bench: 50 channels')`,
      ).run(d.id, version, JSON.stringify(d), Date.now());
      db.prepare(
        `INSERT INTO reservoirs (id, name, dam_name, time_zone, current_version) VALUES (?, ?, ?, ?, ?)
         ON CONFLICT (id) DO UPDATE SET current_version = excluded.current_version`,
      ).run(d.id, d.name, d.damName, d.timeZone, version);
    }
  });
  put();
  db.close();
}

const rssMb = (pid: number) => {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
};
/**
 * Memory levels off when the last third of the run peaks no higher than the middle third, give or
 * take 5 %: the heap grows in a saw-tooth between collections, and a leak raises every tooth.
 */
function levelling(samples: Array<[number, number]>, seconds: number) {
  const peak = (from: number, to: number) =>
    Math.max(...samples.filter(([t]) => t >= from && t < to).map(([, mb]) => mb));
  const middle = peak(seconds / 3, (2 * seconds) / 3);
  const last = peak((2 * seconds) / 3, Infinity);
  return { middle, last, ok: last <= middle * 1.05 };
}

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-load-'));
  const database = join(dir, 'load.sqlite');
  const [mqttPort, httpPort] = [await freePort(), await freePort()];
  const broker = await startProcess(
    ['--input-type=module', '-e', BROKER],
    { P: String(mqttPort) },
    /broker ready/,
  );
  const gatewayEnv = {
    PORT: String(httpPort),
    MQTT_URL: `mqtt://127.0.0.1:${mqttPort}`,
    DATABASE_PATH: database,
    CONSOLE_DIST: join(dir, 'none'),
    MQTT_CLIENT_ID: 'stillwell-load',
    DEMO_MODE: 'true',
  };
  const main = join(here, '../dist/main.js');
  // first start: migrations and the demo seed; then the five 50-channel definitions are seeded
  const first = await startProcess([main], gatewayEnv, /Stillwell is on/);
  await stop(first.child);
  const defs = Array.from({ length: RESERVOIRS }, (_, i) => definitionOf(i));
  seed(database, defs);
  const gateway = await startProcess([main], gatewayEnv, /Stillwell is on/);
  const pid = gateway.child.pid!;
  const base = `http://127.0.0.1:${httpPort}`;
  // demo mode prints this start's passwords: the operator's, read from the gateway's own output
  const password = /^\s+operator\s+(\S+)/m.exec(gateway.out())?.[1];
  if (!password) throw new Error('no demo operator password in the gateway output');
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: 'operator', password }),
  });
  const { accessToken } = (await signIn.json()) as { accessToken: string };

  // 200 consoles, spread over the reservoirs, each measuring publish-to-screen latency
  const sentAt = new Map<string, number>();
  const latencies: number[] = [];
  const received = new Array<number>(RESERVOIRS).fill(0);
  const sockets: Socket[] = [];
  for (let c = 0; c < CLIENTS; c += 1) {
    const r = c % RESERVOIRS;
    const socket = io(`${base}${LIVE_NAMESPACE}`, {
      transports: ['websocket'],
      auth: { token: accessToken },
      reconnection: false,
    });
    socket.on(LIVE_EVENTS.readings, (batch: Reading[]) => {
      const at = performance.now();
      for (const reading of batch) {
        const s = sentAt.get(`${reading.reservoirId}/${reading.deviceId}/${reading.seq}`);
        if (s !== undefined) latencies.push(at - s);
      }
      received[r]! += batch.length;
    });
    const ack = (await socket
      .timeout(10_000)
      .emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: defs[r]!.id })) as { ok: boolean };
    if (!ack.ok) throw new Error(`subscribe refused: ${JSON.stringify(ack)}`);
    sockets.push(socket);
  }

  // one MQTT connection per reservoir (its field network), 50 channels each once a second
  const publishers: MqttClient[] = [];
  for (let r = 0; r < RESERVOIRS; r += 1)
    publishers.push(await connectAsync(`mqtt://127.0.0.1:${mqttPort}`, { protocolVersion: 4 }));
  const seqs = new Map<string, number>();
  const rss: Array<[number, number]> = [];
  const t0 = performance.now();
  const sampler = setInterval(() => rss.push([(performance.now() - t0) / 1000, rssMb(pid)]), 1000);
  rss.push([0, rssMb(pid)]);
  let published = 0;
  const inflight: Promise<unknown>[] = [];
  for (let s = 0; s < SECONDS; s += 1) {
    for (let k = 0; k < CHANNELS; k += 1) {
      // each second's 250 messages spread evenly over it
      const due = t0 + s * 1000 + (k * 1000) / CHANNELS;
      const wait = due - performance.now();
      if (wait > 1) await new Promise((res) => setTimeout(res, wait));
      for (let r = 0; r < RESERVOIRS; r += 1) {
        const def = defs[r]!;
        const c = def.channels[k]!;
        const key = `${def.id}/${c.deviceId}`;
        const seq = seqs.get(key) ?? 0;
        seqs.set(key, seq + 1);
        const payload = JSON.stringify({
          deviceId: c.deviceId,
          channel: c.id,
          seq,
          time: new Date().toISOString(),
          value: (c.min + c.max) / 2,
          unit: c.unit,
          quality: 'good',
        });
        sentAt.set(`${key}/${seq}`, performance.now());
        inflight.push(
          publishers[r]!.publishAsync(telemetryTopic(def.id, c.deviceId), payload, { qos: 1 }),
        );
        published += 1;
      }
    }
    await Promise.all(inflight.splice(0));
  }
  const expectedLive = (published / RESERVOIRS) * CLIENTS;
  const until = performance.now() + 10_000;
  while (received.reduce((a, b) => a + b, 0) < expectedLive && performance.now() < until)
    await new Promise((res) => setTimeout(res, 50));
  clearInterval(sampler);
  rss.push([(performance.now() - t0) / 1000, rssMb(pid)]);

  for (const s of sockets) s.close();
  for (const p of publishers) await p.endAsync();
  await stop(gateway.child);
  await stop(broker.child);
  const db = new Database(database, { readonly: true });
  const stored = (db.prepare(`SELECT COUNT(*) AS n FROM readings`).get() as { n: number }).n;
  db.close();
  rmSync(dir, { recursive: true, force: true });

  latencies.sort((a, b) => a - b);
  const pct = (p: number) =>
    latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))] ?? NaN;
  const mem = rss.map((p) => p[1]);
  const level = levelling(rss, SECONDS);
  const live = received.reduce((a, b) => a + b, 0);
  const load = `${RESERVOIRS}x${CHANNELS} ch at 1 Hz, ${CLIENTS} clients, ${SECONDS} s`;
  const results = [
    {
      name: `load: readings lost (${load})`,
      value: published - stored,
      unit: `of ${published}`,
      target: '0',
      ok: stored === published,
    },
    {
      name: 'load: live readings delivered to clients',
      value: live,
      unit: `of ${expectedLive}`,
      target: String(expectedLive),
      ok: live === expectedLive,
    },
    {
      name: 'load: publish-to-screen latency p50',
      value: +pct(50).toFixed(1),
      unit: 'ms',
      target: '-',
      ok: true,
    },
    {
      name: 'load: publish-to-screen latency p99',
      value: +pct(99).toFixed(1),
      unit: 'ms',
      target: '< 250',
      ok: pct(99) < 250,
    },
    {
      name: 'load: gateway RSS at start',
      value: +mem[0]!.toFixed(0),
      unit: 'MB',
      target: '-',
      ok: true,
    },
    {
      // one sample each 10 s of the run: a leak shows as a steady climb, warm-up as a step that stops
      name: 'load: gateway RSS every 10 s',
      value: rss
        .filter((p, i) => i === 0 || Math.floor(p[0] / 10) > Math.floor(rss[i - 1]![0] / 10))
        .map((p) => p[1].toFixed(0))
        .join(' / '),
      unit: 'MB',
      target: '-',
      ok: true,
    },
    {
      name: 'load: gateway RSS peak',
      value: +Math.max(...mem).toFixed(0),
      unit: 'MB',
      target: '< 512',
      ok: Math.max(...mem) < 512,
    },
    {
      name: 'load: gateway RSS at end',
      value: +mem[mem.length - 1]!.toFixed(0),
      unit: 'MB',
      target: '-',
      ok: true,
    },
    {
      name: 'load: gateway RSS levels off (peak of last third vs middle third)',
      value: `${level.last.toFixed(0)} vs ${level.middle.toFixed(0)}`,
      unit: 'MB',
      target: 'last <= middle + 5 %',
      ok: level.ok,
    },
  ];
  if (json) console.log(JSON.stringify({ suite: 'load', results }));
  else
    for (const r of results)
      console.log(`${r.ok ? 'ok  ' : 'MISS'} ${r.name}: ${r.value} ${r.unit} (target ${r.target})`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
