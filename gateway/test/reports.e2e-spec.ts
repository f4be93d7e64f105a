import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import request from 'supertest';
import type { Notice } from '@stillwell/shared/notices';
import type { Order } from '@stillwell/shared/orders';
import {
  eventReportSchema,
  reportJobSchema,
  type EventReport,
  type ReportJob,
} from '@stillwell/shared/reports';
import { telemetryTopic } from '@stillwell/shared/telemetry';
import { SiteClockService } from '../src/clock/site-clock.service';
import { ForecastsService } from '../src/forecasts/forecasts.service';
import { OrderNoticesListener } from '../src/notices/orders/order-notices.listener';
import { StatusService } from '../src/telemetry/status.service';
import { signInAs, type SignedInUser } from './support/auth';
import { eventually } from './support/gateway';
import {
  api,
  draft,
  oneGate,
  RES,
  startOrdersWorld,
  sweep,
  type OrdersWorld,
} from './orders/setup';

const MIN = 60_000;
const HOUR = 60 * MIN;
const STEP = 10 * MIN;
const STEPS = 60;
/** The invented storm of this test, hour h of the window: the pool peaks at hour 7. */
const poolAt = (h: number) => 205 + 1.2 * Math.exp(-(((h - 7) / 2.5) ** 2));
const inflowAt = (h: number) => 300 + 900 * Math.exp(-(((h - 5) / 2) ** 2));
const outflowAt = (h: number) => 200 + 300 * Math.exp(-(((h - 7.5) / 2) ** 2));

interface Raw {
  channel: string;
  device_id: string;
  seq: number;
  time: number;
  value: number;
  quality: string;
}

/** Plain least squares, per hour (the definition docs/reports.md gives), brute force. */
function slope(points: Array<{ t: number; v: number }>): number | null {
  const n = points.length;
  const mt = points.reduce((s, p) => s + p.t, 0) / n;
  const mv = points.reduce((s, p) => s + p.v, 0) / n;
  let num = 0;
  let den = 0;
  for (const p of points) {
    num += (p.t - mt) * (p.v - mv);
    den += (p.t - mt) ** 2;
  }
  return den === 0 ? null : (num / den) * HOUR;
}

/**
 * Event reports from a real record: a storm driven step by step on the site clock over a real
 * broker (gauges, a gate controller), real forecast runs, a gate order drafted, authorised,
 * noticed downstream, executed and confirmed, an alarm acknowledged. Every expected figure is
 * computed here from the raw rows of the SQLite file, by plain code.
 */
describe('event reports', () => {
  let world: OrdersWorld;
  let liaison: SignedInUser;
  let reviewer: SignedInUser;
  let T0: number;
  let outSeq = 0;
  let order: Order;
  let report: EventReport;
  let job: ReportJob;
  const percents: number[] = [];
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-reports-test-'));

  const setSite = (ms: number) =>
    world.gateway.app
      .get(SiteClockService)
      .accept(
        `stillwell/v1/${RES}/clock`,
        Buffer.from(JSON.stringify({ siteTime: new Date(ms).toISOString(), speed: 1e-6 })),
      );
  const base = () => `/reservoirs/${RES}/reports`;
  const raw = (sql: string, ...args: unknown[]) => {
    const db = new Database(world.gateway.databasePath, { readonly: true });
    try {
      return db.prepare(sql).all(...args) as Array<Record<string, unknown>>;
    } finally {
      db.close();
    }
  };
  const from = () => T0;
  const to = () => T0 + STEPS * STEP + MIN;

  async function publishOutflow(t: number, value: number, quality = 'good') {
    const message = {
      deviceId: 'release-gauge',
      channel: 'outflow',
      seq: outSeq++,
      time: new Date(t).toISOString(),
      value,
      unit: 'm3/s',
      quality,
    };
    await world.field.client.publishAsync(
      telemetryTopic(RES, 'release-gauge'),
      JSON.stringify(message),
      { qos: 1 },
    );
  }

  /** One step of the storm: the site clock, every gauge at its value, stored. */
  async function step(i: number) {
    const t = T0 + i * STEP;
    const h = (t - T0) / HOUR;
    setSite(t);
    world.field.pool = poolAt(h);
    world.field.inflow = inflowAt(h);
    await publishOutflow(t, outflowAt(h));
    await world.field.report();
    const status = world.gateway.app.get(StatusService);
    await eventually(() => {
      const c = status.status(RES).channels.find((x) => x.channel === 'outflow');
      if (c?.t !== t) throw new Error('outflow not stored yet');
    });
  }

  beforeAll(async () => {
    world = await startOrdersWorld({
      NOTICE_TICK_MS: '0',
      DEMO_SMTP_PORT: '0',
      ORDER_AUTHORISATION_TTL_MIN: '600',
      ORDER_FOLLOW_GRACE_S: '3600',
    });
    liaison = await signInAs(world.gateway, 'liaison');
    reviewer = await signInAs(world.gateway, 'reviewer');
    // whole hours, a day ahead of every reading the setup stored
    T0 = Math.ceil(Date.now() / HOUR) * HOUR + 24 * HOUR;
    const forecasts = world.gateway.app.get(ForecastsService);
    const settle = () => world.gateway.app.get(OrderNoticesListener).settled();
    for (let i = 0; i <= STEPS; i += 1) {
      await step(i);
      const at = i * STEP;
      // the forecast operators saw 6, 3 and 1 hours before the peak (hour 7)
      if ([1, 4, 6].some((x) => at === x * HOUR))
        expect(await forecasts.run(RES, 'schedule', 'report test')).not.toBeNull();
      if (at === 2 * HOUR) {
        order = await draft(world, oneGate('gate-1', 2.3, 'draw down ahead of the peak'));
        await settle();
      }
      if (at === 2 * HOUR + STEP)
        await api(world, world.users.engineer)
          .post(`/orders/${order.id}/authorise`, { comment: 'checked against the forecast' })
          .expect(200);
      if (at === 2 * HOUR + 2 * STEP) {
        const notices = (
          await api(world, liaison).get(`/reservoirs/${RES}/notices?orderId=${order.id}`)
        ).body as Notice[];
        expect(notices.length).toBeGreaterThan(0);
        for (const n of notices)
          await api(world, liaison).post(`/notices/${n.id}/send`).expect(200);
      }
      if (at === 3 * HOUR + 3 * STEP) {
        await api(world, world.users.operator).post(`/orders/${order.id}/execute`).expect(200);
        await eventually(() => expect(world.field.commands.length).toBeGreaterThan(0));
      }
      if (at === 3 * HOUR + 4 * STEP) {
        await world.field.move('gate-1', 2.3);
        await sweep(world);
        await eventually(async () =>
          expect(
            ((await api(world, world.users.operator).get(`/orders/${order.id}`)).body as Order)
              .state,
          ).toBe('in-position'),
        );
      }
      if (at === 5 * HOUR) {
        // acknowledge every alarm raised so far, as the operator on shift
        const list = (await api(world, world.users.operator).get(`/reservoirs/${RES}/alarms`))
          .body as { alarms: Array<{ conditionId: string; state: string }> };
        const open = list.alarms.filter((a) => a.state === 'unacknowledged');
        expect(open.length).toBeGreaterThan(0);
        for (const a of open)
          await api(world, world.users.operator)
            .post(`/reservoirs/${RES}/alarms/${a.conditionId}/acknowledge`, {})
            .expect(200);
      }
      // one bad outflow reading, far above the rest: a report must leave it out
      if (at === 7 * HOUR) await publishOutflow(T0 + 7 * HOUR + 5 * MIN, 5000, 'bad');
    }
    await eventually(() =>
      expect(raw(`SELECT 1 FROM readings WHERE quality = 'bad'`)).toHaveLength(1),
    );
  }, 120_000);

  afterAll(async () => {
    await world?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('runs as a job whose progress reaches 100, and downloads its results', async () => {
    const created = await api(world, reviewer)
      .post(base(), { from: new Date(from()).toISOString(), to: new Date(to()).toISOString() })
      .expect(202);
    job = reportJobSchema.parse(created.body);
    await eventually(async () => {
      const res = await api(world, reviewer).get(`${base()}/${job.id}`).expect(200);
      const now = reportJobSchema.parse(res.body);
      percents.push(now.percent);
      expect(now.error).toBeNull();
      expect(now.stage).toBe('done');
    }, 60_000);
    expect(percents.at(-1)).toBe(100);
    // never backwards
    expect(percents).toEqual([...percents].sort((a, b) => a - b));
    const json = await api(world, reviewer)
      .get(`${base()}/${job.id}/result?format=json`)
      .expect(200);
    report = eventReportSchema.parse(JSON.parse(json.text));
    expect(report.demo).toBe(true);
  });

  it('summary figures equal those computed from the raw readings', () => {
    const rows = raw(
      `SELECT channel, time, value, quality, id FROM readings
       WHERE reservoir_id = ? AND time >= ? AND time < ? ORDER BY time, id`,
      RES,
      from(),
      to(),
    ) as unknown as Array<Raw & { id: number }>;
    const ok = (channel: string) =>
      rows
        .filter((r) => r.channel === channel && r.quality !== 'bad')
        .map((r) => ({ t: r.time, v: r.value }));
    const peakOf = (pts: Array<{ t: number; v: number }>) =>
      pts.reduce((best, p) => (p.v > best.v ? p : best), pts[0]!);
    for (const [channel, got] of [
      ['pool.radar', report.summary.peakPool],
      ['inflow', report.summary.peakInflow],
      ['outflow', report.summary.peakOutflow],
    ] as const) {
      const want = peakOf(ok(channel));
      expect(got).toEqual({ channel, value: want.v, t: want.t });
    }
    // the storm's own figures: pool peak at hour 7, the bad 5000 m3/s left out
    expect(report.summary.peakPool!.t).toBe(T0 + 7 * HOUR);
    expect(report.summary.peakPool!.value).toBeCloseTo(poolAt(7), 9);
    expect(report.summary.peakOutflow!.value).toBeLessThan(1000);
    expect(report.summary.badCount).toBe(1);
    expect(report.summary.readingCount).toBe(rows.length);

    const pool = ok('pool.radar');
    let best: { value: number; t: number } | null = null;
    for (const p of pool) {
      const span = pool.filter((q) => q.t <= p.t && q.t >= p.t - 30 * MIN);
      const s = span.length >= 3 ? slope(span) : null;
      if (s !== null && (!best || s > best.value)) best = { value: s, t: p.t };
    }
    expect(best).not.toBeNull();
    expect(report.summary.maxRateOfRise!.t).toBe(best!.t);
    expect(report.summary.maxRateOfRise!.value).toBeCloseTo(best!.value, 9);
  });

  it('compares the stored forecast runs of 6, 3 and 1 hours before the peak with what happened', () => {
    const peak = report.summary.peakPool!;
    const runs = raw(
      `SELECT id, computed_at, peak_elevation, peak_time FROM forecast_runs WHERE reservoir_id = ?`,
      RES,
    ) as Array<{ id: number; computed_at: number; peak_elevation: number; peak_time: number }>;
    for (const lead of [6, 3, 1]) {
      const mark = peak.t - lead * HOUR;
      const run = runs
        .filter((r) => r.computed_at <= mark && r.computed_at >= mark - HOUR)
        .sort((a, b) => b.computed_at - a.computed_at || b.id - a.id)[0];
      expect(run).toBeDefined();
      const got = report.forecasts.find((f) => f.leadHours === lead)!;
      expect(got).toMatchObject({
        runId: run!.id,
        computedAt: mark,
        forecastPeak: run!.peak_elevation,
        forecastPeakTime: run!.peak_time,
      });
      expect(got.error).toBeCloseTo(run!.peak_elevation - peak.value, 9);
      expect(got.timingError).toBe(run!.peak_time - peak.t);
    }
  });

  it('traces the gate order from draft to confirmation from its logbook entries', () => {
    const entries = raw(
      `SELECT seq, kind, payload, actor_name FROM logbook_entries ORDER BY seq`,
    ).filter((e) => {
      const p = JSON.parse(e.payload as string) as { orderId?: number };
      return p.orderId === order.id && /^(order|command)\./.test(e.kind as string);
    });
    const times = entries.map((e) => Date.parse(JSON.parse(e.payload as string).siteTime));
    const got = report.orders.find((o) => o.orderId === order.id)!;
    expect(got.state).toBe('in-position');
    expect(got.steps.map((s) => s.kind)).toEqual(entries.map((e) => e.kind));
    expect(got.steps.map((s) => s.logbookSeq)).toEqual(entries.map((e) => e.seq));
    expect(got.steps.map((s) => s.sincePrevious)).toEqual(
      times.map((t, i) => (i === 0 ? null : t - times[i - 1]!)),
    );
    const drafted = times[entries.findIndex((e) => e.kind === 'order.drafted')]!;
    const confirmed = times[entries.findIndex((e) => e.kind === 'order.in-position')]!;
    expect(drafted).toBe(T0 + 2 * HOUR);
    expect(got.draftToConfirmation).toBe(confirmed - drafted);
  });

  it('gives each contact the lead time they got against what they needed', () => {
    const rows = raw(
      `SELECT r.id, r.sent_at, r.lead_time_s, c.person FROM notice_recipients r
       JOIN release_notices n ON n.id = r.notice_id JOIN downstream_contacts c ON c.id = r.contact_id
       WHERE n.order_id = ?`,
      String(order.id),
    ) as Array<{ sent_at: number; lead_time_s: number; person: string }>;
    expect(rows.length).toBeGreaterThan(0);
    const [orderRow] = raw(`SELECT body FROM orders WHERE id = ?`, order.id);
    const executedAt = Date.parse(JSON.parse(orderRow!.body as string).execution.at);
    expect(executedAt).toBe(T0 + 3 * HOUR + 3 * STEP);
    for (const r of rows) {
      const got = report.notices.find((n) => n.contactName === r.person)!;
      const gotS = (executedAt - r.sent_at) / 1000;
      expect(got).toMatchObject({ sentAt: r.sent_at, neededS: r.lead_time_s, gotS });
      expect(got.short).toBe(gotS < r.lead_time_s);
    }
  });

  it('counts alarms and times to acknowledge from the raw alarm events', () => {
    const events = raw(
      `SELECT condition_id, kind, site_time FROM alarm_events
       WHERE reservoir_id = ? AND site_time >= ? AND site_time < ? AND kind IN ('raised', 'acknowledged')
       ORDER BY site_time, id`,
      RES,
      from(),
      to(),
    ) as Array<{ condition_id: string; kind: string; site_time: number }>;
    const raised = events.filter((e) => e.kind === 'raised').length;
    const toAck: number[] = [];
    const open = new Map<string, number>();
    for (const e of events) {
      if (e.kind === 'raised') open.set(e.condition_id, e.site_time);
      else if (open.has(e.condition_id)) {
        toAck.push(e.site_time - open.get(e.condition_id)!);
        open.delete(e.condition_id);
      }
    }
    expect(toAck.length).toBeGreaterThan(0);
    expect(report.alarms.raised).toBe(raised);
    expect(report.alarms.acknowledged).toBe(toAck.length);
    expect(report.alarms.byCondition.flatMap((c) => c.timesToAck).sort((a, b) => a - b)).toEqual(
      [...toAck].sort((a, b) => a - b),
    );
  });

  it('carries the head hash the verification endpoint gives', async () => {
    const res = await api(world, reviewer).get('/logbook/verify').expect(200);
    expect(res.body.ok).toBe(true);
    expect(report.logbook).toMatchObject({
      ok: true,
      headSeq: res.body.headSeq,
      headHash: res.body.headHash,
    });
    expect(report.logbook.headHash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('exports every reading of the window, and only those, as CSV', async () => {
    const csv = await api(world, reviewer).get(`${base()}/${job.id}/result?format=csv`).expect(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.split('\r\n').filter(Boolean);
    expect(lines[0]).toBe('channel,device_id,seq,time,time_ms,value,quality,received_at');
    const rows = raw(
      `SELECT channel, device_id, seq, time FROM readings WHERE reservoir_id = ? AND time >= ? AND time < ?`,
      RES,
      from(),
      to(),
    ) as unknown as Raw[];
    expect(lines).toHaveLength(rows.length + 1);
    const key = (r: Pick<Raw, 'channel' | 'device_id' | 'seq' | 'time'>) =>
      `${r.channel}|${r.device_id}|${r.seq}|${r.time}`;
    const fromCsv = lines.slice(1).map((l) => {
      const [channel, device_id, seq, , time] = l.split(',');
      return key({
        channel: channel!,
        device_id: device_id!,
        seq: Number(seq),
        time: Number(time),
      });
    });
    expect(fromCsv.sort()).toEqual(rows.map(key).sort());
  });

  it('writes a PDF that opens and says what it must (parsed by pdf-parse in a child process)', async () => {
    const pdf = await api(world, reviewer)
      .get(`${base()}/${job.id}/result?format=pdf`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const path = join(dir, 'report.pdf');
    writeFileSync(path, pdf.body as Buffer);
    // pdf-parse loads pdfjs-dist by dynamic import, which jest's CommonJS runtime cannot: plain node can
    const text = execFileSync(
      process.execPath,
      [
        '-e',
        `const { PDFParse } = require('pdf-parse');
         new PDFParse({ data: require('fs').readFileSync(process.argv[1]) }).getText()
           .then((r) => process.stdout.write(JSON.stringify({ text: r.text, pages: r.total })))`,
        path,
      ],
      { cwd: join(__dirname, '..'), encoding: 'utf8' },
    );
    const parsed = JSON.parse(text) as { text: string; pages: number };
    const flat = parsed.text.replace(/\s+/g, ' ');
    expect(parsed.pages).toBeGreaterThanOrEqual(1);
    expect(flat).toContain('Event report: Lake Orrin');
    expect(flat).toMatch(
      /approved operating rules, its emergency action plan, local codes and the responsible licensed engineer prevail/,
    );
    expect(flat).toMatch(/Demo scenario/);
    expect(flat).toContain(report.summary.peakPool!.value.toFixed(3));
    expect(flat).toContain(`Order ${order.id}`);
    expect(flat).toContain(report.logbook.headHash!.slice(0, 32));
    // the chart titles are drawn only inside the SVG charts: both charts made it into the PDF
    expect(flat).toContain('Pool elevation');
    expect(flat).toContain('Inflow and outflow');
  });

  it('refuses bad windows with a 400 naming the field', async () => {
    const post = (body: object, reservoir = RES) =>
      api(world, reviewer).post(`/reservoirs/${reservoir}/reports`, body);
    const iso = (ms: number) => new Date(ms).toISOString();
    const backwards = await post({ from: iso(to()), to: iso(from()) }).expect(400);
    expect(backwards.body.message).toMatch(/^from: /);
    const same = await post({ from: iso(from()), to: iso(from()) }).expect(400);
    expect(same.body.message).toMatch(/^from: /);
    const long = await post({ from: iso(from()), to: iso(from() + 32 * 24 * HOUR) }).expect(400);
    expect(long.body.message).toMatch(/^to: .*31 days/);
    const unknown = await post({ from: iso(from()), to: iso(to()) }, 'lake-nowhere').expect(400);
    expect(unknown.body.message).toMatch(/^reservoirId: /);
    const garbled = await post({ from: 'yesterday', to: iso(to()) }).expect(400);
    expect(garbled.body.message).toMatch(/^from: /);
    const format = await post({ from: iso(from()), to: iso(to()), formats: ['docx'] }).expect(400);
    expect(format.body.message).toMatch(/^formats\.0: /);
  });

  it('lets only the roles with reports.create make reports, and only the owner read a job', async () => {
    const body = { from: new Date(from()).toISOString(), to: new Date(to()).toISOString() };
    await api(world, world.users.operator).post(base(), body).expect(403);
    await api(world, world.users.engineer).get(`${base()}/${job.id}`).expect(404);
    await request(world.gateway.url).get(`/api${base()}/${job.id}`).expect(401);
  });
});
