#!/usr/bin/env node
// `npm run test:scale` (not part of `npm test`): two built gateways sharing one site's load on
// Debian's PostgreSQL, Redis and Mosquitto, all on loopback, with the simulator. Proves by counting
// that every reading is stored exactly once, that every console gets the live push whichever
// gateway it is connected to, and that scheduled jobs run on one gateway at a time.
// Needs `npm run build -w shared -w simulator -w gateway` first; root to install the packages.
// SCALE_SECONDS (default 60): how long the plant runs; SCALE_CLIENTS (default 10): consoles per gateway.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { connectConsole, countersOf, signIn, writeShiftNote } from './scale/consoles.mjs';
import { root, simulatorAccounts, startGateway, startSimulator } from './scale/nodes.mjs';
import {
  ensurePackages,
  freePort,
  startMosquitto,
  startPostgres,
  startRedis,
} from './scale/services.mjs';
import {
  jobLeases,
  scheduledForecastRuns,
  sequenceGaps,
  storedReadings,
  withDatabase,
} from './scale/store-checks.mjs';

const SECONDS = Number(process.env.SCALE_SECONDS ?? 60);
const CLIENTS = Number(process.env.SCALE_CLIENTS ?? 10);
const SPEED = 60;
const RESERVOIR = DEMO_RESERVOIR.id;
const log = (line) => console.log(`[scale ${new Date().toISOString().slice(11, 19)}] ${line}`);
const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

const results = [];
const check = (name, ok, detail) => results.push({ name, ok: Boolean(ok), detail });
const figures = [];
const warnings = [];
const stops = [];
const nodes = [];

/** Polls until fn() returns something truthy; that value, or null when the time is up. */
async function until(fn, timeoutMs) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await fn();
    if (v || Date.now() > end) return v || null;
    await sleep(500);
  }
}

async function run() {
  for (const f of ['gateway/dist/main.js', 'simulator/dist/cli.js', 'shared/dist'])
    if (!existsSync(join(root, f))) throw new Error(`${f} missing: run the build first`);
  ensurePackages(log);
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-scale-'));
  stops.push(async () => rmSync(dir, { recursive: true, force: true }));
  const postgres = await startPostgres(log);
  stops.push(postgres.stop);
  const redis = await startRedis(dir, log);
  stops.push(redis.stop);

  // the simulator's accounts and topic rules, in Mosquitto's password and ACL files
  const simEnv = {
    SIM_GATEWAY_USERNAME: 'stillwell-gateway',
    SIM_GATEWAY_PASSWORD: randomBytes(18).toString('base64url'),
    SIM_DEVICE_SECRET: randomBytes(18).toString('base64url'),
  };
  const accounts = await simulatorAccounts(simEnv);
  const { mosquittoAcl } = await import(join(root, 'simulator/dist/broker/mosquitto.js'));
  const mosquitto = await startMosquitto(dir, accounts, mosquittoAcl(RESERVOIR), log);
  stops.push(mosquitto.stop);

  const common = {
    HOST: '127.0.0.1',
    DATABASE_URL: postgres.url,
    REDIS_URL: redis.url,
    MQTT_URL: mosquitto.url,
    MQTT_USERNAME: simEnv.SIM_GATEWAY_USERNAME,
    MQTT_PASSWORD: simEnv.SIM_GATEWAY_PASSWORD,
    MQTT_SHARED_GROUP: 'stillwell-site',
    JWT_SECRET: randomBytes(32).toString('base64url'),
    DEMO_MODE: 'true',
    CONSOLE_DIST: join(dir, 'no-console'),
    SIGN_IN_RATE_PER_MIN: '1000',
  };
  // one after the other: the first runs the migrations, the second finds them done
  const gateways = [];
  for (const name of ['a', 'b']) {
    const port = await freePort();
    const node = await startGateway(`gateway-${name}`, {
      ...common,
      PORT: String(port),
      MQTT_CLIENT_ID: `stillwell-scale-${name}`,
    });
    nodes.push(node);
    stops.push(() => node.stop());
    gateways.push({ name, node, url: `http://127.0.0.1:${port}` });
    log(`gateway-${name} on ${port} (pid ${node.child.pid})`);
  }
  // demo mode gives fresh passwords at each start: the last gateway's stand
  const password = /^\s+operator\s+(\S+)/m.exec(gateways[1].node.output())?.[1];
  if (!password) throw new Error('no demo operator password in the gateway output');
  // signed in on one, the token is good on both (one JWT_SECRET, sessions in the shared database)
  const token = await signIn(gateways[0].url, 'operator', password);

  const consoles = [];
  for (const g of gateways)
    for (let i = 0; i < CLIENTS; i += 1)
      consoles.push(await connectConsole(g.url, token, RESERVOIR, `${g.name}${i}`));
  stops.push(async () => consoles.forEach((c) => c.close()));
  log(`${consoles.length} consoles connected (${CLIENTS} on each gateway)`);

  const statsFile = join(dir, 'sim-stats.json');
  const sim = await startSimulator(simEnv, mosquitto.url, statsFile, SPEED);
  nodes.push(sim);
  stops.push(() => sim.stop('SIGINT'));
  log(`simulator at ${SPEED}x for ${SECONDS} s`);
  await sleep(SECONDS * 1000);
  const notes = [];
  for (const g of gateways)
    notes.push(await writeShiftNote(g.url, token, `scale check: a note through gateway ${g.name}`));

  // the plant holds; the devices send what they still have; then everything must be in
  sim.child.kill('SIGUSR2');
  const stats = await until(() => {
    try {
      const s = JSON.parse(readFileSync(statsFile, 'utf8'));
      return s.held && s.idle ? s : null;
    } catch {
      return null;
    }
  }, 60_000);
  if (!stats) throw new Error('the simulator did not hold and drain within 60 s');
  const expected = new Map(
    stats.devices.map((d) => [d.deviceId, d.lastSeq + 1 - d.lost - d.overrunUnsent - d.unsent]),
  );
  const expectedTotal = [...expected.values()].reduce((a, b) => a + b, 0);
  const stored = await until(
    () =>
      withDatabase(postgres.url, async (db) => {
        const s = await storedReadings(db, RESERVOIR);
        return s.keys.size >= expectedTotal ? s : null;
      }),
    60_000,
  );
  const final = stored ?? (await withDatabase(postgres.url, (db) => storedReadings(db, RESERVOIR)));
  await sleep(3000); // the last live pushes and logbook entries on their way
  // held devices still answer backfill requests: stopped, they write their final counts and
  // send no more, so the gateways' counters and the devices' can be compared
  await sim.stop('SIGINT');
  await sleep(1000);
  const finalStats = JSON.parse(readFileSync(statsFile, 'utf8'));
  const counters = await Promise.all(gateways.map((g) => countersOf(g.url, token)));
  await withDatabase(postgres.url, async (db) => {
    const rows = final.perDevice.reduce((n, d) => n + d.rows, 0);
    const wrong = final.perDevice.filter(
      (d) => d.rows !== d.distinct_keys || d.rows !== expected.get(d.device_id),
    );
    figures.push(`readings produced by the plant and sent: ${expectedTotal}; rows stored: ${rows}`);
    check(
      'every reading stored exactly once (PostgreSQL, per device)',
      rows === expectedTotal && wrong.length === 0 && final.perDevice.length === expected.size,
      wrong
        .map(
          (d) =>
            `${d.device_id}: ${d.rows} rows, ${d.distinct_keys} distinct, expected ${expected.get(d.device_id)}`,
        )
        .join('; '),
    );
    const [a, b] = counters;
    // each message the broker delivered went to one gateway of the group: the originals and the
    // devices' resends on backfill requests, no more (without the group each would get them all)
    const resent = finalStats.devices.reduce((n, d) => n + d.resent, 0);
    figures.push(
      `ingested by gateway-a: ${a.stored}, by gateway-b: ${b.stored}; messages received ${a.received} + ${b.received} = ${expectedTotal} sent + ${resent} resent on backfill requests (repeats ${a.repeats} + ${b.repeats}, late ${a.late} + ${b.late})`,
    );
    check(
      'the shared subscription split the messages: each went to one gateway, each reading inserted by one',
      a.stored > 0 &&
        b.stored > 0 &&
        a.stored + b.stored === rows &&
        a.received + b.received === expectedTotal + resent &&
        a.quarantined + b.quarantined === 0,
      `stored ${a.stored} + ${b.stored} of ${rows}; received ${a.received + b.received} of ${expectedTotal + resent}; quarantined ${a.quarantined + b.quarantined}`,
    );

    // every console saw the same readings, and all that were news: a reading first stored late (a
    // backfilled one) is not pushed live, so at most late - repeats fewer than were stored
    const notNews = Math.max(0, a.late + b.late - a.repeats - b.repeats);
    const union = new Set(consoles.flatMap((c) => [...c.readings]));
    const short = consoles.filter((c) => c.readings.size !== union.size || c.repeats() > 0);
    const foreign = [...union].filter((k) => !final.keys.has(k));
    figures.push(
      `live readings per console: ${union.size} of ${rows} stored; consoles short: ${short.length} of ${consoles.length}`,
    );
    check(
      'every console got every live reading, whichever gateway it is on',
      union.size >= rows - notNews && short.length === 0 && foreign.length === 0 && union.size > 0,
      `${union.size} of ${rows} (not news: ${notNews}); ` +
        short.map((c) => `${c.label}: ${c.readings.size}, ${c.repeats()} repeated`).join('; '),
    );
    const missed = consoles.filter((c) => !notes.every((id) => c.logbook.has(id)));
    check(
      'a logbook entry written through either gateway reached every console (Redis adapter)',
      missed.length === 0,
      missed.map((c) => c.label).join(', '),
    );

    const leases = await jobLeases(db);
    const pids = gateways.map((g) => g.node.child.pid);
    const strangers = leases.filter((l) => !pids.some((pid) => l.holder.includes(`:${pid}:`)));
    figures.push(
      `job leases: ${leases.map((l) => `${l.job} -> gateway-${l.holder.includes(`:${pids[0]}:`) ? 'a' : 'b'}`).join(', ')}`,
    );
    const forecasts = await scheduledForecastRuns(db, 60_000);
    figures.push(
      `scheduled forecast runs: ${forecasts.total}, periods run twice: ${forecasts.doubled.length}`,
    );
    check(
      'scheduled jobs ran once across the gateways (one lease holder each, no doubled forecast period)',
      leases.length > 0 &&
        strangers.length === 0 &&
        forecasts.total > 0 &&
        !forecasts.doubled.length,
      JSON.stringify(forecasts.doubled.slice(0, 5)),
    );
    // each gateway follows a device's numbers through its own share only (see docs/scale-out.md)
    const gaps = await sequenceGaps(db, RESERVOIR);
    const lost = stats.devices.reduce((n, d) => n + d.lost + d.overrunUnsent, 0);
    figures.push(`sequence gaps recorded: ${gaps} (readings the plant really lost: ${lost})`);
    if (gaps > 0 && lost === 0)
      warnings.push(
        `${gaps} sequence gaps recorded with nothing lost: ${resent} resends asked for`,
      );
  });

  // the holder stops: it gives its leases up, and the other gateway takes every job over
  const holds = (g) => (l) => l.holder.includes(`:${g.node.child.pid}:`);
  const [first, second] = gateways;
  const held = (await withDatabase(postgres.url, jobLeases)).filter(holds(first)).map((l) => l.job);
  const stoppedAt = Date.now();
  await first.node.stop();
  const moved = await until(
    () =>
      withDatabase(postgres.url, async (db) => {
        const leases = await jobLeases(db);
        return held.every((job) => leases.some((l) => l.job === job && holds(second)(l)))
          ? leases
          : null;
      }),
    30_000,
  );
  figures.push(
    `lease handover after gateway-a stopped: ${moved ? `${((Date.now() - stoppedAt) / 1000).toFixed(1)} s for ${held.length} jobs` : 'none within 30 s'}`,
  );
  check(
    'when the holding gateway stops, the other takes its scheduled jobs over',
    moved && moved.every(holds(second)),
    JSON.stringify(moved ?? held),
  );
}

let failure = null;
try {
  await run();
} catch (error) {
  failure = error;
}
for (const stop of stops.reverse()) await stop().catch((e) => log(`cleanup: ${e.message}`));

console.log('\n=== test:scale: two gateways, PostgreSQL, Redis, Mosquitto (Debian), loopback ===');
for (const f of figures) console.log(`  ${f}`);
for (const w of warnings) console.log(`WARN  ${w}`);
for (const r of results)
  console.log(
    `${r.ok ? 'PASS' : 'FAIL'}  ${r.name}${!r.ok && r.detail ? `\n      ${r.detail}` : ''}`,
  );
if (failure) {
  console.log(`FAIL  the run did not complete: ${failure.message}`);
  for (const n of nodes) console.log(`--- ${n.name} (last output) ---\n${n.output().slice(-2000)}`);
}
const ok = !failure && results.length > 0 && results.every((r) => r.ok);
console.log(ok ? 'test:scale PASSED' : 'test:scale FAILED');
process.exit(ok ? 0 : 1);
