// Replay benchmark (not a test): the downsampled query of a 7-day window of 20 channels at 1-second
// readings (about 12 million rows), their one-minute aggregates and hourly roll-ups, in a real SQLite
// file, through the gateway's own resolution choice (default limits) and series reader. `npm run bench -w gateway` runs every suite; this one alone:
// `node --import tsx bench/replay.ts [--json]` (BENCH_REPLAY_DAYS, BENCH_REPLAY_CHANNELS to shrink it).
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { z } from 'zod';
import type { ReplayResolution } from '@stillwell/shared/replay';
import { InitialSchema1764633600000 } from '../src/database/migrations/1764633600000-initial-schema';
import { Retention1765065600000 } from '../src/database/migrations/1765065600000-retention';
import { replayEnv } from '../src/replay/replay-env';
import { chooseResolution } from '../src/replay/resolution';
import { readSeries } from '../src/replay/series-reader';
import { type Queryable, rollUpHours } from '../src/retention/aggregate-sql';
import { foldMinutes, HOUR_MS, type RawReading } from '../src/retention/minute-aggregates';

const DAYS = Number(process.env.BENCH_REPLAY_DAYS ?? 7);
const CHANNELS = Number(process.env.BENCH_REPLAY_CHANNELS ?? 20);
const BUCKETS = 1000;
const REPEAT = 7;
const json = process.argv.includes('--json');
const RES = 'bench-reservoir';
const T0 = Date.UTC(2026, 0, 1);
const SPAN_MS = DAYS * 86_400_000;

/** The gateway's SQL helpers take TypeORM's query(); here the same calls on bare better-sqlite3. */
function queryable(db: Database.Database): Queryable {
  const statements = new Map<string, Database.Statement>();
  return {
    query: (sql: string, params: unknown[] = []) => {
      let s = statements.get(sql);
      if (!s) statements.set(sql, (s = db.prepare(sql)));
      return Promise.resolve(s.reader ? s.all(...params) : s.run(...params));
    },
  };
}

function build(db: Database.Database): { rows: number; seconds: number; peaks: number[] } {
  const started = performance.now();
  const insert = db.prepare(
    `INSERT INTO readings (reservoir_id, device_id, channel, seq, time, value, quality, received_at)
     VALUES (?, ?, ?, ?, ?, ?, 'good', ?)`,
  );
  const aggregate = db.prepare(
    `INSERT INTO reading_aggregates (reservoir_id, channel, minute, count, min, min_time, max, max_time,
       mean, suspect_count, bad_count, first_received_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 0, 0, ?)`,
  );
  const values = Array.from({ length: CHANNELS }, (_, c) => 100 + c);
  const peaks = values.map(() => -Infinity);
  // one sharp spike per channel somewhere in the week: the query must keep it
  const spikeAt = values.map(() => Math.floor(Math.random() * (SPAN_MS / 1000)));
  const minute: RawReading[][] = values.map(() => []);
  let rows = 0;
  const seconds = SPAN_MS / 1000;
  const perTx = 3600;
  for (let s0 = 0; s0 < seconds; s0 += perTx) {
    db.transaction(() => {
      for (let s = s0; s < Math.min(seconds, s0 + perTx); s += 1) {
        const time = T0 + s * 1000;
        for (let c = 0; c < CHANNELS; c += 1) {
          values[c]! += (Math.random() - 0.5) * 0.2;
          const value = s === spikeAt[c] ? values[c]! + 500 : values[c]!;
          peaks[c] = Math.max(peaks[c]!, value);
          insert.run(RES, `dev-${c}`, `ch-${c}`, s, time, value, time + 20);
          rows += 1;
          minute[c]!.push({ time, value, quality: 'good', received_at: time + 20 });
          if ((s + 1) % 60 === 0) {
            for (const m of foldMinutes(minute[c]!))
              aggregate.run(
                RES,
                `ch-${c}`,
                m.minute,
                m.count,
                m.min,
                m.minTime,
                m.max,
                m.maxTime,
                m.mean,
                m.firstReceivedAt,
              );
            minute[c] = [];
          }
        }
      }
    })();
  }
  db.prepare(
    `INSERT INTO retention_marks (reservoir_id, aggregated_through, pruned_through) VALUES (?, ?, 0)`,
  ).run(RES, T0 + SPAN_MS);
  return { rows, seconds: (performance.now() - started) / 1000, peaks };
}

async function timeQuery(
  db: Queryable,
  fromMs: number,
  toMs: number,
  resolution: ReplayResolution,
  repeat = REPEAT,
): Promise<{ ms: number; points: number; sourcePoints: number; maxPerSeries: number }[]> {
  const out = [];
  for (let r = 0; r < repeat; r += 1) {
    const started = performance.now();
    const series = [];
    for (let c = 0; c < CHANNELS; c += 1)
      series.push(
        await readSeries(db, {
          reservoirId: RES,
          channel: `ch-${c}`,
          fromMs,
          toMs,
          buckets: BUCKETS,
          resolution,
          aggregatedThroughMs: T0 + SPAN_MS,
        }),
      );
    const ms = performance.now() - started;
    out.push({
      ms,
      points: series.reduce((n, s) => n + s.t.length, 0),
      sourcePoints: series.reduce((n, s) => n + s.sourcePoints, 0),
      maxPerSeries: Math.max(...series.map((s) => s.t.length)),
    });
  }
  return out;
}

/** What the replay service would choose for the window with its default limits. */
function serviceChoice(fromMs: number, toMs: number) {
  const limits = z.object(replayEnv).parse({});
  return chooseResolution({
    fromMs,
    toMs,
    intervalsS: Array.from({ length: CHANNELS }, () => 1),
    rawMaxRows: limits.REPLAY_RAW_MAX_ROWS,
    minuteMaxRows: limits.REPLAY_MINUTE_MAX_ROWS,
    prunedThroughMs: 0,
  });
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-bench-replay-'));
  const file = join(dir, 'replay.sqlite');
  const db = new Database(file);
  db.pragma('journal_mode = WAL');
  // the build is set-up, not what is measured: no fsync per transaction while filling the file
  db.pragma('synchronous = OFF');
  const runner = { query: (sql: string) => Promise.resolve(db.exec(sql)) };
  await new InitialSchema1764633600000().up(runner as never);
  await new Retention1765065600000().up(runner as never);
  const built = build(db);
  db.pragma('wal_checkpoint(TRUNCATE)');
  db.pragma('synchronous = FULL');
  const q = queryable(db);
  const rollStarted = performance.now();
  // the hourly roll-ups, by the retention job's own code
  for (let c = 0; c < CHANNELS; c += 1) await rollUpHours(q, RES, `ch-${c}`, T0, T0 + SPAN_MS);
  const rollS = (performance.now() - rollStarted) / 1000;
  db.pragma('wal_checkpoint(TRUNCATE)');
  const sizeMb = statSync(file).size / 2 ** 20;
  const choice = serviceChoice(T0, T0 + SPAN_MS);
  const week = await timeQuery(q, T0, T0 + SPAN_MS, choice.resolution);
  // for comparison only: the same window read minute by minute (what the roll-up saves)
  const minutes =
    choice.resolution === 'minute' ? week : await timeQuery(q, T0, T0 + SPAN_MS, 'minute', 3);
  // peaks: the true maximum of every channel must be among the points served
  let peaksKept = 0;
  for (let c = 0; c < CHANNELS; c += 1) {
    const s = await readSeries(q, {
      reservoirId: RES,
      channel: `ch-${c}`,
      fromMs: T0,
      toMs: T0 + SPAN_MS,
      buckets: BUCKETS,
      resolution: choice.resolution,
      aggregatedThroughMs: T0 + SPAN_MS,
    });
    if (Math.max(...s.v) === built.peaks[c]) peaksKept += 1;
  }
  const hourWindow = serviceChoice(T0 + SPAN_MS / 2, T0 + SPAN_MS / 2 + HOUR_MS);
  const hour = await timeQuery(
    q,
    T0 + SPAN_MS / 2,
    T0 + SPAN_MS / 2 + HOUR_MS,
    hourWindow.resolution,
  );
  db.close();
  rmSync(dir, { recursive: true, force: true });

  const weekMs = median(week.map((w) => w.ms));
  const minuteMs = median(minutes.map((w) => w.ms));
  const hourMs = median(hour.map((w) => w.ms));
  const results = [
    {
      name: `replay: ${DAYS}-day window, ${CHANNELS} channels, downsampled, at the resolution the service chooses (${choice.resolution}; ${week[0]!.sourcePoints.toLocaleString('en')} points read)`,
      value: +weekMs.toFixed(1),
      unit: 'ms',
      target: '<= 100',
      ok: weekMs <= 100,
    },
    {
      name: `replay: most points of one series served for that window (${BUCKETS} buckets)`,
      value: week[0]!.maxPerSeries,
      unit: 'points',
      target: `<= ${2 * BUCKETS}`,
      ok: week[0]!.maxPerSeries <= 2 * BUCKETS,
    },
    {
      name: 'replay: true peak of every channel among the points served',
      value: peaksKept,
      unit: `of ${CHANNELS}`,
      target: String(CHANNELS),
      ok: peaksKept === CHANNELS,
    },
    {
      name: `replay: the same window from minute aggregates (${minutes[0]!.sourcePoints.toLocaleString('en')} points read; for comparison)`,
      value: +minuteMs.toFixed(1),
      unit: 'ms',
      target: '-',
      ok: true,
    },
    {
      name: `replay: 1-hour window, ${CHANNELS} channels (${hourWindow.resolution}) downsampled`,
      value: +hourMs.toFixed(1),
      unit: 'ms',
      target: '-',
      ok: true,
    },
    {
      name: `replay: bench file built (${built.rows.toLocaleString('en')} readings + aggregates, ${sizeMb.toFixed(0)} MiB; roll-up ${rollS.toFixed(1)} s)`,
      value: Math.round(built.rows / built.seconds),
      unit: 'rows/s',
      target: '-',
      ok: true,
    },
  ];
  if (json) console.log(JSON.stringify({ suite: 'replay', results }));
  else
    for (const r of results)
      console.log(`${r.ok ? 'ok  ' : 'MISS'} ${r.name}: ${r.value} ${r.unit} (target ${r.target})`);
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
