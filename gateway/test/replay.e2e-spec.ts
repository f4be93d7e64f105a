import request from 'supertest';
import { DataSource } from 'typeorm';
import type { ReplayEntry, ReplayEntryPage, ReplayWindow } from '@stillwell/shared/replay';
import { WriteQueueService } from '../src/database/write-queue.service';
import { ForecastRunRow } from '../src/forecasts/forecast-run.entity';
import { LogbookService } from '../src/logbook/logbook.service';
import { AggregationService } from '../src/retention/aggregation.service';
import { ACCESS_TEST_ENV, signInAs, type SignedInUser } from './support/auth';
import { startTestBroker, type TestBroker } from './support/broker';
import { startTestGateway, type TestGateway } from './support/gateway';

const RES = 'lake-orrin';
const MIN = 60_000;
const H = 3_600_000;
const DAY_MS = 24 * H;
const iso = (ms: number) => new Date(ms).toISOString();

interface Row {
  channel: string;
  time: number;
  value: number;
  quality?: string;
  receivedAt?: number;
}

describe('replay: a recorded window from what is stored', () => {
  let broker: TestBroker;
  let gateway: TestGateway;
  let reviewer: SignedInUser;
  let db: DataSource;
  let seq = 0;

  beforeAll(async () => {
    broker = await startTestBroker();
    gateway = await startTestGateway({
      ...ACCESS_TEST_ENV,
      MQTT_URL: broker.url,
      RETENTION_TICK_MS: '0',
      FORECAST_TICK_MS: '0',
      REPLAY_RAW_MAX_ROWS: '5000',
      REPLAY_MINUTE_MAX_ROWS: '10000',
    });
    db = gateway.app.get(DataSource);
    reviewer = await signInAs(gateway, 'reviewer');
  });

  afterAll(async () => {
    await gateway?.close();
    await broker?.stop();
  });

  /** Readings as the ingestion stores them, written through the one write queue. */
  async function insertReadings(rows: readonly Row[]): Promise<void> {
    await gateway.app.get(WriteQueueService).run(() =>
      db.transaction(async (tx) => {
        for (const r of rows) {
          seq += 1;
          await tx.query(
            `INSERT INTO readings (reservoir_id, device_id, channel, seq, time, value, quality, received_at)
             VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
            [
              RES,
              'test-device',
              r.channel,
              seq,
              r.time,
              r.value,
              r.quality ?? 'good',
              r.receivedAt ?? r.time,
            ],
          );
        }
      }),
    );
  }

  const get = (path: string, query: Record<string, string | number>, user = reviewer) =>
    request(gateway.url)
      .get(`/api/reservoirs/${RES}/replay/${path}`)
      .query(query)
      .set('Authorization', `Bearer ${user.token}`);

  it('yields the stored readings, alarm events, forecast runs and logbook entries of the window, in order and complete', async () => {
    const logbook = gateway.app.get(LogbookService);
    // a plant clock at 60x: site time T0 + 60 (wall - W0). The window opens just now, so the
    // gateway's own entries of its start and the sign-in (earlier) map to before it.
    const W0 = Date.now() - 1000;
    const T0 = Math.floor(Date.UTC(2026, 2, 10, 4) / MIN) * MIN;
    const speed = 60;
    const pool: Row[] = [];
    for (let i = 0; i < 240; i += 1) {
      const time = T0 + i * 30_000;
      pool.push({
        channel: 'pool.radar',
        time,
        value: 204 + i / 1000,
        receivedAt: W0 + (time - T0) / speed + 3,
      });
    }
    const inflow = pool
      .filter((_, i) => i % 2 === 0)
      .map((p, i) => ({ ...p, channel: 'inflow', value: 30 + i }));
    // outside the window: must not be served
    const outside = [{ channel: 'pool.radar', time: T0 - 5 * MIN, value: 1 }];
    await insertReadings([...pool, ...inflow, ...outside]);
    const fromMs = T0;
    const toMs = T0 + 2 * H - 1;

    // logbook: entries naming their site time, one of another reservoir, two shift notes without
    const actor = { userId: 'u-1', username: 'ines.halvard', roles: ['operator'] };
    const recorded = [T0 + 100 * MIN, T0 + 5 * MIN, T0 + 50 * MIN];
    const seqs: number[] = [];
    for (const t of recorded)
      seqs.push(
        (
          await logbook.append({
            kind: 'order.drafted',
            actor,
            payload: { reservoirId: RES, siteTime: iso(t), text: `at ${t}` },
          })
        ).seq,
      );
    const excluded = [
      await logbook.append({
        kind: 'order.drafted',
        actor,
        payload: { reservoirId: 'elsewhere', siteTime: iso(T0 + 10 * MIN) },
      }),
      await logbook.append({ kind: 'order.drafted', actor, payload: { siteTime: iso(T0 - H) } }),
    ].map((x) => x.seq);
    const wallBefore = Date.now();
    for (const text of ['gates checked', 'handover to night shift'])
      seqs.push((await logbook.append({ kind: 'shift.note', actor, payload: { text } })).seq);
    const wallAfter = Date.now();
    const allSeqs = [...seqs, ...excluded];

    // alarm events: one before the window (standing at its start), two inside
    const alarmRow = (kind: string, siteTime: number) =>
      db.query(
        `INSERT INTO alarm_events (reservoir_id, condition_id, kind, site_time, wall_time, priority, annunciated, actor_name, text)
         VALUES (?, 'pool.watch', ?, ?, 0, 'advisory', 1, ?, ?)`,
        [RES, kind, siteTime, kind === 'acknowledged' ? 'operator' : null, kind],
      );
    await alarmRow('raised', T0 - 10 * MIN);
    await alarmRow('acknowledged', T0 + 20 * MIN);
    await alarmRow('cleared', T0 + 80 * MIN);

    // forecast runs: the one standing when the window opens, and one inside
    const runIds: number[] = [];
    for (const computedAt of [T0 - 2 * MIN, T0 + 30 * MIN]) {
      const p90 = [205, 205.5, 206 + computedAt / 1e15];
      const result = await db.getRepository(ForecastRunRow).insert({
        reservoirId: RES,
        computedAt,
        storedAt: Date.now(),
        trigger: 'schedule',
        triggerDetail: 'test',
        definitionVersion: 1,
        codeVersion: '{}',
        startElevation: 204,
        peakElevation: 206,
        peakTime: computedAt + H,
        peakP90: 206.5,
        timeLeftStatus: 'ok',
        latestStart: null,
        inputs: '{}',
        outputs: JSON.stringify({
          series: {
            startMs: computedAt,
            stepS: 300,
            inflow: [],
            elevation: [205, 205.2, 205.4],
            outflow: [],
            p10: [204, 204, 204],
            p50: [205, 205, 205],
            p90,
          },
        }),
        decisions: '{}',
      });
      runIds.push((result.identifiers[0] as { id: number }).id);
    }

    const res = await get('window', { from: iso(fromMs), to: iso(toMs) }).expect(200);
    const w = res.body as ReplayWindow;
    expect(w.resolution).toBe('raw');
    const radar = w.series.find((s) => s.channel === 'pool.radar')!;
    expect(radar.t).toEqual(pool.map((p) => p.time));
    expect(radar.v).toEqual(pool.map((p) => p.value));
    expect(w.series.find((s) => s.channel === 'inflow')!.t).toEqual(inflow.map((p) => p.time));
    expect(w.series.map((s) => s.channel)).toEqual(
      expect.arrayContaining([
        'pool.radar',
        'pool.pressure',
        'inflow',
        'outflow',
        'gate.1.opening',
      ]),
    );
    expect(w.alarmsAtStart).toEqual([
      expect.objectContaining({ conditionId: 'pool.watch', state: 'unacknowledged' }),
    ]);
    expect(w.alarmEvents.map((e) => e.kind)).toEqual(['acknowledged', 'cleared']);
    expect(w.forecastRuns.map((r) => r.id)).toEqual(runIds);

    const band = await get(`forecast-runs/${runIds[1]}`, {}).expect(200);
    expect(band.body.p90).toEqual([205, 205.5, 206 + (T0 + 30 * MIN) / 1e15]);
    expect(band.body.caution).toMatch(/as it stood/);

    // the entries, a page of two at a time, until the end
    const got: ReplayEntry[] = [];
    const totals: number[] = [];
    let after: string | null = null;
    let pages = 0;
    do {
      const page: ReplayEntryPage = (
        await get('entries', {
          from: iso(fromMs),
          to: iso(toMs),
          limit: 2,
          ...(after ? { after } : {}),
        }).expect(200)
      ).body;
      got.push(...page.entries);
      totals.push(page.total);
      after = page.next;
      pages += 1;
    } while (after && pages < 10);
    const total = totals[0];
    expect(new Set(totals)).toEqual(new Set([total]));
    expect(got).toHaveLength(total!);
    expect(new Set(got.map((e) => e.seq)).size).toBe(total);
    const mine = got.filter((e) => allSeqs.includes(e.seq));
    expect(mine.map((e) => e.seq).sort((a, b) => a - b)).toEqual(seqs.sort((a, b) => a - b));
    // the rest are the gateway's own (the demo accounts it is still creating): written since W0
    for (const e of got.filter((x) => !allSeqs.includes(x.seq))) {
      expect(e.timeSource).toBe('estimated');
      expect(Date.parse(e.time)).toBeGreaterThanOrEqual(W0);
    }
    const times = got.map((e) => e.siteTimeMs);
    expect(times).toEqual([...times].sort((a, b) => a - b));
    expect(got.filter((e) => e.timeSource === 'recorded').map((e) => e.siteTimeMs)).toEqual(
      [...recorded].sort((a, b) => a - b),
    );
    // the shift notes, placed by the clock mapping between the wall times they were written
    for (const note of got.filter((e) => e.kind === 'shift.note')) {
      expect(note.timeSource).toBe('estimated');
      expect(note.siteTimeMs).toBeGreaterThanOrEqual(T0 + (wallBefore - W0 - 3) * speed - 1000);
      expect(note.siteTimeMs).toBeLessThanOrEqual(T0 + (wallAfter - W0) * speed + 1000);
    }
  });

  it('downsamples long windows keeping the true extremes and bounding the points, raw and aggregated', async () => {
    const T0 = Math.floor(Date.UTC(2026, 4, 1) / H) * H;
    const DAYS = 10;
    const rows: Row[] = [];
    const n = (DAYS * 24 * H) / MIN;
    const spikeAt = 3 + Math.floor(Math.random() * (n / 2));
    const dipAt = n - 30 - Math.floor(Math.random() * 200);
    for (let i = 0; i < n; i += 1) {
      let value = 100 + 20 * Math.sin(i / 500) + Math.random();
      if (i === spikeAt) value = 2500 + Math.random();
      if (i === dipAt) value = 0.5 * Math.random();
      rows.push({
        channel: 'inflow',
        time: T0 + i * MIN + 7000,
        value,
        receivedAt: T0 + i * MIN + 7000,
      });
    }
    await insertReadings(rows);
    // aggregate all but the last day, so the window mixes aggregates and raw readings
    await gateway.app.get(AggregationService).aggregate(RES, T0 + (DAYS - 1) * 24 * H);
    const peak = rows[spikeAt]!;
    const dip = rows[dipAt]!;
    const from = iso(T0);
    const to = iso(T0 + DAYS * 24 * H);
    const w = (await get('window', { from, to, buckets: 200, channels: 'inflow' }).expect(200))
      .body as ReplayWindow;
    // 14,400 readings > 5,000 raw; 14,400 minutes > 10,000: hourly roll-ups, minutes, raw tail
    expect(w.resolution).toBe('hour');
    expect(w.resolutionReason).toMatch(/more than 5,000.*more than 10,000/);
    const s = w.series[0]!;
    expect(s.channel).toBe('inflow');
    expect(s.t.length).toBeLessThanOrEqual(400);
    expect(s.t.length).toBeGreaterThan(200);
    // aggregated up to 2 min before day 9 (the grace): 215 whole hours (min and max each), the
    // 58 minutes of the hour not yet whole, then 1,442 raw readings
    expect(s.sourcePoints).toBe(215 * 2 + 58 + 1442);
    expect(Math.max(...s.v)).toBe(peak.value);
    expect(s.t[s.v.indexOf(peak.value)]).toBe(peak.time);
    expect(Math.min(...s.v)).toBe(dip.value);
    expect(s.t).toEqual([...s.t].sort((a, b) => a - b));

    // a short window of raw readings, cut into 10 buckets: still the spike
    // a window of the aggregated days short enough for minute aggregates: every minute is there
    const minutes = (
      await get('window', {
        from: iso(T0 + DAY_MS),
        to: iso(T0 + 5 * DAY_MS),
        buckets: 5000,
        channels: 'inflow',
      }).expect(200)
    ).body as ReplayWindow;
    expect(minutes.resolution).toBe('minute');
    expect(minutes.series[0]!.sourcePoints).toBe(4 * 1440);
    expect(minutes.series[0]!.t).toEqual(
      rows.filter((r) => r.time >= T0 + DAY_MS && r.time <= T0 + 5 * DAY_MS).map((r) => r.time),
    );

    const short = (
      await get('window', {
        from: iso(peak.time - 2 * H),
        to: iso(peak.time + 2 * H),
        buckets: 10,
        channels: 'inflow',
      }).expect(200)
    ).body as ReplayWindow;
    expect(short.resolution).toBe('raw');
    expect(short.series[0]!.t.length).toBeLessThanOrEqual(20);
    expect(Math.max(...short.series[0]!.v)).toBe(peak.value);
  });

  it('refuses bad windows naming the field, and readers without replay.read', async () => {
    const t = Date.UTC(2026, 4, 1);
    const cases: Array<[Record<string, string | number>, RegExp]> = [
      [{ to: iso(t) }, /from/],
      [{ from: 'yesterday', to: iso(t) }, /from/],
      [{ from: iso(t), to: iso(t - 1) }, /to: must be after from/],
      [{ from: iso(t), to: iso(t + 40 * 24 * H) }, /to: the window may be at most 31 days/],
      [{ from: iso(t), to: iso(t + H), buckets: 5 }, /buckets/],
      [{ from: iso(t), to: iso(t + H), buckets: 'many' }, /buckets/],
      [{ from: iso(t), to: iso(t + H), channels: 'pool.radar,nowhere' }, /channels: .*nowhere/],
    ];
    for (const [query, message] of cases) {
      const res = await get('window', query).expect(400);
      expect(JSON.stringify(res.body)).toMatch(message);
    }
    const bad = await get('entries', { from: iso(t), to: iso(t + H), after: 'x' }).expect(400);
    expect(JSON.stringify(bad.body)).toMatch(/after/);
    const stakeholder = await signInAs(gateway, 'stakeholder');
    await get('window', { from: iso(t), to: iso(t + H) }, stakeholder).expect(403);
  });
});
