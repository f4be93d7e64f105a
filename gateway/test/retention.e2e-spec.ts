import Database from 'better-sqlite3';
import request from 'supertest';
import { DataSource } from 'typeorm';
import type { ReplayWindow } from '@stillwell/shared/replay';
import { WriteQueueService } from '../src/database/write-queue.service';
import { ForecastRunRow } from '../src/forecasts/forecast-run.entity';
import { LogbookService } from '../src/logbook/logbook.service';
import { AggregationService } from '../src/retention/aggregation.service';
import { PruneService } from '../src/retention/prune.service';
import { RetentionScheduler } from '../src/retention/retention-scheduler.service';
import { ACCESS_TEST_ENV, signInAs } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

const RES = 'lake-orrin';
const MIN = 60_000;
const H = 3_600_000;
const DAY = 24 * H;

interface Stat {
  channel: string;
  minute: number;
  count: number;
  min: number | null;
  max: number | null;
  mean: number | null;
}

describe('retention: minute aggregates for ever, raw readings pruned only once aggregated', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let db: DataSource;
  let aggregation: AggregationService;
  let pruning: PruneService;
  let seq = 0;
  // three days of site time, well before the (wall-clock) site now of the test gateway
  const T0 = Math.floor(Date.UTC(2026, 0, 5) / H) * H;
  const CHANNELS = ['pool.radar', 'inflow'];

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      RETENTION_TICK_MS: '0',
      FORECAST_TICK_MS: '0',
      READINGS_RETENTION_DAYS: '1',
      AGGREGATE_GRACE_S: '120',
    });
    db = gateway.app.get(DataSource);
    aggregation = gateway.app.get(AggregationService);
    pruning = gateway.app.get(PruneService);
    // irregular times, noise, and some suspect and bad readings
    const rows: unknown[][] = [];
    for (const channel of CHANNELS) {
      let t = T0;
      while (t < T0 + 3 * DAY) {
        t += 5_000 + Math.floor(Math.random() * 50_000);
        const r = Math.random();
        const quality = r < 0.03 ? 'bad' : r < 0.08 ? 'suspect' : 'good';
        rows.push([channel, t, 200 + Math.random() * 10, quality]);
      }
    }
    await insert(rows);
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  async function insert(rows: unknown[][]): Promise<void> {
    await gateway.app.get(WriteQueueService).run(() =>
      db.transaction(async (tx) => {
        for (const [channel, time, value, quality] of rows) {
          seq += 1;
          await tx.query(
            `INSERT INTO readings (reservoir_id, device_id, channel, seq, time, value, quality, received_at)
             VALUES (?, 'test-device', ?, ?, ?, ?, ?, ?)`,
            [RES, channel, seq, time, value, quality, Number(time) + 40],
          );
        }
      }),
    );
  }

  /** Computed here from the raw rows with plain SQL, independently of the job's code. */
  function expectedFromRaw(beforeMs: number): Stat[] {
    const raw = new Database(gateway.databasePath, { readonly: true });
    try {
      return raw
        .prepare(
          `SELECT channel, (time / 60000) * 60000 AS minute,
                  SUM(quality <> 'bad') AS count,
                  MIN(CASE WHEN quality <> 'bad' THEN value END) AS min,
                  MAX(CASE WHEN quality <> 'bad' THEN value END) AS max,
                  AVG(CASE WHEN quality <> 'bad' THEN value END) AS mean
           FROM readings WHERE reservoir_id = ? AND time < ?
           GROUP BY channel, minute ORDER BY channel, minute`,
        )
        .all(RES, beforeMs) as Stat[];
    } finally {
      raw.close();
    }
  }

  const stored = async (beforeMs = Number.MAX_SAFE_INTEGER): Promise<Stat[]> =>
    (await db.query(
      `SELECT channel, minute, count, min, max, mean FROM reading_aggregates
       WHERE reservoir_id = ? AND minute < ? ORDER BY channel, minute`,
      [RES, beforeMs],
    )) as Stat[];

  const rawCount = async (where: string, params: unknown[]): Promise<number> =>
    (
      (await db.query(`SELECT COUNT(*) AS n FROM readings WHERE reservoir_id = ? AND ${where}`, [
        RES,
        ...params,
      ])) as Array<{ n: number }>
    )[0]!.n;

  const compare = (got: Stat[], want: Stat[]) => {
    expect(got.map((s) => [s.channel, Number(s.minute), s.count, s.min, s.max])).toEqual(
      want.map((s) => [s.channel, Number(s.minute), s.count, s.min, s.max]),
    );
    got.forEach((s, i) => {
      if (want[i]!.mean === null) expect(s.mean).toBeNull();
      else expect(s.mean).toBeCloseTo(want[i]!.mean!, 9);
    });
  };

  it('aggregates only closed minutes, equal to min/max/mean/count from the raw rows, and is idempotent', async () => {
    const now = T0 + 1.5 * DAY + 30_000;
    const closedBefore = Math.floor((now - 120_000) / MIN) * MIN;
    const written = await aggregation.aggregate(RES, now);
    const want = expectedFromRaw(closedBefore);
    expect(written).toBe(want.length);
    expect(want.length).toBeGreaterThan(1000);
    compare(await stored(), want);
    // nothing from the minutes still open (within the grace period)
    expect(await stored()).toHaveLength(want.length);
    const again = await aggregation.aggregate(RES, now);
    expect(again).toBe(0);
    compare(await stored(), want);
  });

  it('prunes only raw readings older than the period AND aggregated, never the logbook or forecast runs', async () => {
    const logbook = gateway.app.get(LogbookService);
    await logbook.append({
      kind: 'shift.note',
      actor: null,
      payload: { text: 'old note', siteTime: new Date(T0 + H).toISOString() },
    });
    await db.getRepository(ForecastRunRow).insert({
      reservoirId: RES,
      computedAt: T0 + H,
      storedAt: T0 + H,
      trigger: 'schedule',
      triggerDetail: 'old run',
      definitionVersion: 1,
      codeVersion: '{}',
      startElevation: 204,
      peakElevation: 205,
      peakTime: T0 + 2 * H,
      peakP90: 205.2,
      timeLeftStatus: 'ok',
      latestStart: null,
      inputs: '{}',
      outputs: '{}',
      decisions: '{}',
    });
    const countOf = async (table: string) =>
      ((await db.query(`SELECT COUNT(*) AS n FROM ${table}`)) as Array<{ n: number }>)[0]!.n;
    const logbookBefore = await countOf('logbook_entries');
    const runsBefore = await countOf('forecast_runs');

    // a reading that comes late into a minute already aggregated
    const lateMinute = T0 + 10 * H;
    await insert([['inflow', lateMinute + 59_000, 999.5, 'good']]);
    const wantLate = expectedFromRaw(T0 + 3 * DAY).find(
      (s) => s.channel === 'inflow' && Number(s.minute) === lateMinute,
    )!;

    // the period (1 day) has passed for readings before day 2, but only 1.5 days are aggregated
    const now = T0 + 3 * DAY;
    const aggregatedThrough = Math.floor((T0 + 1.5 * DAY + 30_000 - 120_000) / MIN) * MIN;
    const cutoff = now - DAY;
    const notAggregatedButOld = await rawCount('time >= ? AND time < ?', [
      aggregatedThrough,
      cutoff,
    ]);
    const recent = await rawCount('time >= ?', [cutoff]);
    expect(notAggregatedButOld).toBeGreaterThan(0);
    const deleted = await pruning.prune(RES, now);
    expect(deleted).toBeGreaterThan(0);
    expect(await rawCount('time < ?', [aggregatedThrough])).toBe(0);
    expect(await rawCount('time >= ? AND time < ?', [aggregatedThrough, cutoff])).toBe(
      notAggregatedButOld,
    );
    expect(await rawCount('time >= ?', [cutoff])).toBe(recent);
    // the late minute was recomputed from raw before its readings went
    const late = (await stored()).find(
      (s) => s.channel === 'inflow' && Number(s.minute) === lateMinute,
    )!;
    expect([late.count, late.max]).toEqual([wantLate.count, wantLate.max]);
    expect(late.max).toBe(999.5);

    // once aggregated further, the rest of the old readings go; the recent ones stay
    await aggregation.aggregate(RES, now);
    await pruning.prune(RES, now);
    expect(await rawCount('time < ?', [cutoff])).toBe(0);
    expect(await rawCount('time >= ?', [cutoff])).toBe(recent);
    expect(await countOf('logbook_entries')).toBeGreaterThanOrEqual(logbookBefore);
    expect(await countOf('forecast_runs')).toBe(runsBefore);
    const old = (await db.query(
      `SELECT COUNT(*) AS n FROM logbook_entries WHERE payload LIKE '%old note%'`,
    )) as Array<{ n: number }>;
    expect(old[0]!.n).toBe(1);

    // the replay of the pruned days comes from the aggregates, true peak included
    const reviewer = await signInAs(gateway, 'reviewer');
    const res = await request(gateway.url)
      .get(`/api/reservoirs/${RES}/replay/window`)
      .query({
        from: new Date(T0).toISOString(),
        to: new Date(T0 + 1.5 * DAY).toISOString(),
        channels: 'inflow',
        buckets: 50,
      })
      .set('Authorization', `Bearer ${reviewer.token}`)
      .expect(200);
    const w = res.body as ReplayWindow;
    expect(w.resolution).toBe('minute');
    expect(w.resolutionReason).toMatch(/pruned/);
    expect(Math.max(...w.series[0]!.v)).toBe(999.5);
    expect(w.series[0]!.t.length).toBeLessThanOrEqual(100);
  });

  it('the scheduled handler runs both jobs by the site clock (here the wall clock, months later)', async () => {
    const want = expectedFromRaw(Number.MAX_SAFE_INTEGER);
    await gateway.app.get(RetentionScheduler).tick();
    expect(await rawCount('time < ?', [T0 + 3 * DAY + H])).toBe(0);
    expect((await stored()).length).toBeGreaterThanOrEqual(want.length);
  });
});
