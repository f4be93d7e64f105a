import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import type Database from 'better-sqlite3';
import { DataSource } from 'typeorm';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { REPORT_CAUTION, type EventReport, type ReportStage } from '@stillwell/shared/reports';
import { downsampleMinMax, type SeriesPoint } from '@stillwell/shared/telemetry';
import type { Env } from '../config';
import { LogbookVerifier } from '../logbook/logbook-verifier.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { alarmFigures } from './figures/alarm-figures';
import { forecastChecks } from './figures/forecast-checks';
import { noticeLeads } from './figures/notice-leads';
import { orderTimelines } from './figures/order-timelines';
import { maxRateOfRise, peakOf } from './figures/reading-figures';
import { ReadingsSource } from './readings-source';
import { RecordSource } from './record-source.service';

/** Chart series are cut to this many min-max buckets: peaks stay, the PDF stays small. */
export const CHART_BUCKETS = 400;

export type Progress = (stage: ReportStage, percent: number) => void;

/** Lets the event loop answer progress polls and store readings between the long reads. */
const breathe = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Collects an event report's figures for a window from the stored record. */
@Injectable()
export class ReportBuilder {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
    private readonly records: RecordSource,
    private readonly verifier: LogbookVerifier,
    private readonly config: ConfigService<Env, true>,
  ) {}

  /** A read-only connection to the database file (the shared one for an in-memory database). */
  openReadings(): ReadingsSource {
    const driver = this.dataSource.driver as unknown as { databaseConnection: Database.Database };
    return new ReadingsSource(
      this.config.get('DATABASE_PATH', { infer: true }),
      driver.databaseConnection,
    );
  }

  async build(
    reservoirId: string,
    from: number,
    to: number,
    progress: Progress = () => undefined,
  ): Promise<EventReport> {
    const { definition } = this.reservoirs.get(reservoirId);
    const byRole = (role: string) => definition.channels.find((c) => c.role === role)?.id ?? null;

    progress('readings', 2);
    await breathe();
    const source = this.openReadings();
    let summary: EventReport['summary'];
    let charts: EventReport['charts'];
    try {
      const read = (channel: string | null) =>
        channel ? source.points(reservoirId, channel, from, to) : null;
      // the first gauge of the preference list with readings in the window
      let poolChannel: string | null = null;
      let pool = null;
      for (const c of definition.poolChannels) {
        const got = read(c)!;
        if (got.points.length) {
          [poolChannel, pool] = [c, got];
          break;
        }
      }
      progress('readings', 12);
      await breathe();
      const inflowChannel = byRole('inflow');
      const outflowChannel = byRole('outflow');
      const inflow = read(inflowChannel);
      progress('readings', 20);
      await breathe();
      const outflow = read(outflowChannel);
      progress('readings', 28);
      await breathe();
      const peak = (channel: string | null, pts: SeriesPoint[] | undefined) => {
        const p = pts ? peakOf(pts) : null;
        return p && channel ? { channel, value: p.v, t: p.t } : null;
      };
      const all = [pool, inflow, outflow];
      summary = {
        poolChannel,
        inflowChannel,
        outflowChannel,
        peakPool: peak(poolChannel, pool?.points),
        peakInflow: peak(inflowChannel, inflow?.points),
        peakOutflow: peak(outflowChannel, outflow?.points),
        maxRateOfRise: pool ? maxRateOfRise(pool.points) : null,
        readingCount: source.count(reservoirId, source.channels(reservoirId), from, to),
        suspectCount: all.reduce((s, x) => s + (x?.suspect ?? 0), 0),
        badCount: all.reduce((s, x) => s + (x?.bad ?? 0), 0),
      };
      const chart = (pts: SeriesPoint[] | undefined) =>
        pts ? downsampleMinMax(pts, CHART_BUCKETS, from, to) : [];
      charts = {
        pool: chart(pool?.points),
        inflow: chart(inflow?.points),
        outflow: chart(outflow?.points),
      };
    } finally {
      source.close();
    }

    progress('forecasts', 35);
    const runs = await this.records.forecastRuns(reservoirId, from, to);
    const forecasts = forecastChecks(runs, summary.peakPool);

    progress('decisions', 42);
    const orders = await this.records.orders(reservoirId, from, to);
    const entries = await this.records.orderEntries(orders.map((o) => o.id));
    const timelines = orderTimelines(orders, entries);

    progress('notices', 48);
    const notices = noticeLeads(await this.records.noticeRecipients(reservoirId, from, to, orders));

    progress('alarms', 52);
    const { events, labels } = await this.records.alarmEvents(reservoirId, from, to);
    const alarms = alarmFigures(events, labels);

    progress('logbook', 56);
    // the same verification the logbook's verify endpoint runs: the whole chain, now
    const verdict = await this.verifier.run();

    return {
      reservoirId,
      reservoirName: definition.name,
      from,
      to,
      generatedAt: new Date().toISOString(),
      demo: this.config.get('DEMO_MODE', { infer: true }) && reservoirId === DEMO_RESERVOIR.id,
      caution: REPORT_CAUTION,
      thresholds: definition.thresholds.map((t) => ({ label: t.label, elevation: t.elevation })),
      summary,
      forecasts,
      orders: timelines,
      notices,
      alarms,
      logbook: {
        ok: verdict.ok,
        count: verdict.count,
        headSeq: verdict.headSeq,
        headHash: verdict.headHash,
        checkedAt: verdict.checkedAt,
        problem: verdict.firstBad
          ? `${verdict.firstBad.problem}: ${verdict.firstBad.detail}`
          : null,
      },
      charts,
    };
  }
}
