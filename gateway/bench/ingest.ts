// Ingestion benchmark (not a test): MQTT -> gateway -> SQLite throughput, publish-to-socket latency,
// and the ratio to bare better-sqlite3 batched inserts of the same rows. `npm run bench -w gateway`.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { connectAsync, type MqttClient } from 'mqtt';
import { io } from 'socket.io-client';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import {
  LIVE_EVENTS,
  LIVE_NAMESPACE,
  telemetryTopic,
  type Reading,
} from '@stillwell/shared/telemetry';

const BULK = Number(process.env.BENCH_BULK ?? 100_000);
const STEADY_RATE = 1000;
const STEADY_SECONDS = Number(process.env.BENCH_STEADY_S ?? 10);
const json = process.argv.includes('--json');
const here = import.meta.dirname;

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

function startProcess(
  args: string[],
  env: Record<string, string>,
  ready: RegExp,
): Promise<ChildProcess & { out: () => string }> {
  const child = spawn(process.execPath, args, {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    const onData = (d: Buffer) => {
      out += d.toString();
      if (ready.test(out)) resolve(Object.assign(child, { out: () => out }));
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => reject(new Error(`exited ${code}: ${out}`)));
  });
}

const BROKER = `import net from 'node:net'; import { Aedes } from 'aedes';
const b = await Aedes.createBroker(); const s = net.createServer(b.handle);
s.listen(Number(process.env.P), '127.0.0.1', () => console.log('broker ready'));`;

// Devices and channels of the demo reservoir, each message a plausible value.
const channels = DEMO_RESERVOIR.channels;
const mid = (c: (typeof channels)[number]) => (c.min + c.max) / 2;

async function main() {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-bench-'));
  const [mqttPort, httpPort] = [await freePort(), await freePort()];
  const broker = await startProcess(
    ['--input-type=module', '-e', BROKER],
    { P: String(mqttPort) },
    /broker ready/,
  );
  const gateway = await startProcess(
    [
      ...(process.env.BENCH_PROFILE_DIR
        ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_PROFILE_DIR}`]
        : []),
      join(here, '../dist/main.js'),
    ],
    {
      PORT: String(httpPort),
      MQTT_URL: `mqtt://127.0.0.1:${mqttPort}`,
      DATABASE_PATH: join(dir, 'bench.sqlite'),
      CONSOLE_DIST: join(dir, 'none'),
      MQTT_CLIENT_ID: 'stillwell-bench',
    },
    /Stillwell is on/,
  );
  const base = `http://127.0.0.1:${httpPort}`;
  while ((await (await fetch(`${base}/api/health`)).status) !== 200)
    await new Promise((r) => setTimeout(r, 100));
  // demo mode prints this start's passwords: the operator's, read from the gateway's own output
  const password = /^\s+operator\s+(\S+)/m.exec(gateway.out())?.[1];
  if (!password) throw new Error('no demo operator password in the gateway output');
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ username: 'operator', password }),
  });
  const { accessToken } = (await signIn.json()) as { accessToken: string };
  const counters = async () => {
    const res = await fetch(`${base}/api/telemetry/counters`, {
      headers: { Authorization: `Bearer ${accessToken}` },
    });
    if (!res.ok) throw new Error(`counters: ${res.status}`);
    return (await res.json()) as { stored: number };
  };

  const client: MqttClient = await connectAsync(`mqtt://127.0.0.1:${mqttPort}`, {
    protocolVersion: 4,
  });
  const seqs = new Map<string, number>();
  const message = (i: number, t: number) => {
    const c = channels[i % channels.length]!;
    const seq = seqs.get(c.deviceId) ?? 0;
    seqs.set(c.deviceId, seq + 1);
    const payload = JSON.stringify({
      deviceId: c.deviceId,
      channel: c.id,
      seq,
      time: new Date(t).toISOString(),
      value: mid(c),
      unit: c.unit,
      quality: 'good',
    });
    return {
      topic: telemetryTopic(DEMO_RESERVOIR.id, c.deviceId),
      payload,
      key: `${c.deviceId}:${seq}`,
    };
  };

  // 1. bulk throughput
  const t0 = performance.now();
  const now = Date.now() - 60_000;
  const inflight: Promise<unknown>[] = [];
  for (let i = 0; i < BULK; i += 1) {
    const m = message(i, now + i); // distinct times
    inflight.push(client.publishAsync(m.topic, m.payload, { qos: 1 }));
    if (inflight.length >= 2000) await Promise.all(inflight.splice(0));
  }
  await Promise.all(inflight);
  const published = performance.now();
  let stored: number;
  while ((stored = (await counters()).stored) < BULK && performance.now() - t0 < 120_000) {
    await new Promise((r) => setTimeout(r, 20));
  }
  const elapsedS = (performance.now() - t0) / 1000;
  const gatewayRate = stored / elapsedS;

  // 2. steady 1,000 readings/s, publish-to-socket latency
  const socket = io(`${base}${LIVE_NAMESPACE}`, {
    transports: ['websocket'],
    auth: { token: accessToken },
  });
  await socket.timeout(5000).emitWithAck(LIVE_EVENTS.subscribe, { reservoirId: DEMO_RESERVOIR.id });
  const sentAt = new Map<string, number>();
  const latencies: number[] = [];
  socket.on(LIVE_EVENTS.readings, (batch: Reading[]) => {
    const at = performance.now();
    for (const r of batch) {
      const s = sentAt.get(`${r.deviceId}:${r.seq}`);
      if (s !== undefined) latencies.push(at - s);
    }
  });
  const total = STEADY_RATE * STEADY_SECONDS;
  const start = performance.now();
  for (let i = 0; i < total; i += 1) {
    const due = start + (i * 1000) / STEADY_RATE;
    const wait = due - performance.now();
    if (wait > 1) await new Promise((r) => setTimeout(r, wait));
    const m = message(i, Date.now());
    sentAt.set(m.key, performance.now());
    void client.publishAsync(m.topic, m.payload, { qos: 1 });
  }
  const until = performance.now() + 5000;
  while (latencies.length < total && performance.now() < until)
    await new Promise((r) => setTimeout(r, 20));
  latencies.sort((a, b) => a - b);
  const pct = (p: number) =>
    latencies[Math.min(latencies.length - 1, Math.floor((p / 100) * latencies.length))] ?? NaN;

  // 3. bare better-sqlite3: the same rows, the same schema, 1,000 per transaction
  const bare = new Database(join(dir, 'bare.sqlite'));
  bare.pragma('journal_mode = WAL');
  bare.pragma('synchronous = FULL');
  bare.exec(`CREATE TABLE readings (id INTEGER PRIMARY KEY AUTOINCREMENT, reservoir_id TEXT NOT NULL,
    device_id TEXT NOT NULL, channel TEXT NOT NULL, seq INTEGER NOT NULL, time INTEGER NOT NULL,
    value REAL NOT NULL, quality TEXT NOT NULL, received_at INTEGER NOT NULL);
    CREATE UNIQUE INDEX ux ON readings (reservoir_id, device_id, seq, time);
    CREATE INDEX ix ON readings (reservoir_id, channel, time);`);
  const insert =
    bare.prepare(`INSERT OR IGNORE INTO readings (reservoir_id, device_id, channel, seq, time, value,
    quality, received_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?)`);
  seqs.clear();
  const rows = Array.from({ length: BULK }, (_, i) => JSON.parse(message(i, now + i).payload));
  const many = bare.transaction((batch: typeof rows) => {
    for (const r of batch)
      insert.run(
        'lake-orrin',
        r.deviceId,
        r.channel,
        r.seq,
        Date.parse(r.time),
        r.value,
        r.quality,
        Date.now(),
      );
  });
  const b0 = performance.now();
  for (let i = 0; i < rows.length; i += 1000) many(rows.slice(i, i + 1000));
  const bareRate = BULK / ((performance.now() - b0) / 1000);
  bare.close();

  socket.close();
  await client.endAsync();
  gateway.kill('SIGTERM');
  broker.kill('SIGTERM');
  await new Promise((r) => gateway.once('exit', r));
  rmSync(dir, { recursive: true, force: true });

  const results = [
    {
      name: 'ingest: readings stored per second (MQTT QoS 1 -> SQLite)',
      value: Math.round(gatewayRate),
      unit: 'readings/s',
      target: '>= 10000',
      ok: gatewayRate >= 10_000,
      ratio: gatewayRate / bareRate,
    },
    {
      name: 'ingest: readings lost in the bulk run',
      value: BULK - stored,
      unit: 'readings',
      target: '0',
      ok: stored === BULK,
    },
    {
      name: 'ingest: publish-to-socket latency p50 at 1000/s',
      value: +pct(50).toFixed(1),
      unit: 'ms',
      target: '-',
      ok: true,
    },
    {
      name: 'ingest: publish-to-socket latency p99 at 1000/s',
      value: +pct(99).toFixed(1),
      unit: 'ms',
      target: '< 100',
      ok: pct(99) < 100,
    },
    {
      name: 'ingest: live readings received at 1000/s',
      value: latencies.length,
      unit: `of ${total}`,
      target: String(total),
      ok: latencies.length === total,
    },
    {
      name: 'bare better-sqlite3 batched inserts',
      value: Math.round(bareRate),
      unit: 'rows/s',
      target: '-',
      ok: true,
    },
  ];
  if (json) console.log(JSON.stringify({ suite: 'gateway ingestion', results }));
  else {
    console.log(
      `published ${BULK} in ${((published - t0) / 1000).toFixed(2)} s; stored ${stored} in ${elapsedS.toFixed(2)} s`,
    );
    for (const r of results)
      console.log(
        `${r.ok ? 'ok  ' : 'MISS'} ${r.name}: ${r.value} ${r.unit} (target ${r.target})${'ratio' in r ? `, ratio to bare ${(r.ratio as number).toFixed(3)}` : ''}`,
      );
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
