import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { ChannelDefinition, ChannelRole } from '@stillwell/shared/reservoirs';
import {
  alarmsAt,
  REPLAY_FORECAST_CAUTION,
  type ReplayForecast,
  type ReplayWindow,
} from '@stillwell/shared/replay';
import type { ForecastSeries } from '@stillwell/shared/forecasts';
import { toEvent } from '../alarms/alarm-record';
import { AlarmEventRow } from '../alarms/alarm-event.entity';
import type { Env } from '../config';
import { ForecastRunRow } from '../forecasts/forecast-run.entity';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { RetentionMarksService } from '../retention/retention-marks.service';
import { chooseResolution } from './resolution';
import { readSeries } from './series-reader';

/** What the replay chart shows unless asked for other channels. */
const DEFAULT_ROLES: readonly ChannelRole[] = [
  'pool',
  'inflow',
  'outflow',
  'gate-opening',
  'valve-opening',
];
const DAY_MS = 86_400_000;

export interface WindowRequest {
  fromMs: number;
  toMs: number;
  buckets: number;
  channels?: string[];
}

/** Serves a recorded window from what is stored: readings, alarm events, forecast runs. */
@Injectable()
export class ReplayService {
  readonly rawMaxRows: number;
  readonly minuteMaxRows: number;
  readonly maxWindowMs: number;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
    private readonly marks: RetentionMarksService,
    config: ConfigService<Env, true>,
  ) {
    this.rawMaxRows = config.get('REPLAY_RAW_MAX_ROWS', { infer: true });
    this.minuteMaxRows = config.get('REPLAY_MINUTE_MAX_ROWS', { infer: true });
    this.maxWindowMs = config.get('REPLAY_MAX_WINDOW_DAYS', { infer: true }) * DAY_MS;
  }

  /** Refuses a window that is empty, backwards or longer than allowed, naming the field. */
  checkWindow(fromMs: number, toMs: number): void {
    if (toMs <= fromMs) throw new BadRequestException(['to: must be after from']);
    if (toMs - fromMs > this.maxWindowMs)
      throw new BadRequestException([
        `to: the window may be at most ${this.maxWindowMs / DAY_MS} days (REPLAY_MAX_WINDOW_DAYS)`,
      ]);
  }

  async window(reservoirId: string, q: WindowRequest): Promise<ReplayWindow> {
    const { definition, channels } = this.reservoirs.get(reservoirId);
    this.checkWindow(q.fromMs, q.toMs);
    let wanted: ChannelDefinition[];
    if (q.channels?.length) {
      wanted = q.channels.map((id) => {
        const c = channels.get(id);
        if (!c) throw new BadRequestException([`channels: the reservoir has no channel "${id}"`]);
        return c;
      });
    } else {
      wanted = definition.channels.filter((c) => DEFAULT_ROLES.includes(c.role));
    }
    const marks = await this.marks.get(reservoirId);
    const choice = chooseResolution({
      fromMs: q.fromMs,
      toMs: q.toMs,
      intervalsS: wanted.map((c) => c.intervalS),
      rawMaxRows: this.rawMaxRows,
      minuteMaxRows: this.minuteMaxRows,
      prunedThroughMs: marks.prunedThrough,
    });
    const series = [];
    for (const c of wanted) {
      const cols = await readSeries(this.dataSource, {
        reservoirId,
        channel: c.id,
        fromMs: q.fromMs,
        toMs: q.toMs,
        buckets: q.buckets,
        resolution: choice.resolution,
        aggregatedThroughMs: marks.aggregatedThrough,
      });
      series.push({ channel: c.id, label: c.label, role: c.role, unit: c.unit, ...cols });
    }
    const alarmRepo = this.dataSource.getRepository(AlarmEventRow);
    const byTime = (qb: ReturnType<typeof alarmRepo.createQueryBuilder>) =>
      qb.orderBy('e.site_time', 'ASC').addOrderBy('e.id', 'ASC').getMany();
    const before = await byTime(
      alarmRepo
        .createQueryBuilder('e')
        .where('e.reservoir_id = :reservoirId AND e.site_time < :from', {
          reservoirId,
          from: q.fromMs,
        }),
    );
    const inWindow = await byTime(
      alarmRepo
        .createQueryBuilder('e')
        .where('e.reservoir_id = :reservoirId AND e.site_time >= :from AND e.site_time <= :to', {
          reservoirId,
          from: q.fromMs,
          to: q.toMs,
        }),
    );
    return {
      reservoirId,
      fromMs: q.fromMs,
      toMs: q.toMs,
      buckets: q.buckets,
      resolution: choice.resolution,
      resolutionReason: choice.reason,
      series,
      alarmsAtStart: alarmsAt([], before.map(toEvent), q.fromMs),
      alarmEvents: inWindow.map(toEvent),
      forecastRuns: await this.forecastMarks(reservoirId, q.fromMs, q.toMs),
    };
  }

  private async forecastMarks(reservoirId: string, fromMs: number, toMs: number) {
    const rows = (await this.dataSource.query(
      `SELECT * FROM (SELECT "id", "computed_at" FROM "forecast_runs"
         WHERE "reservoir_id" = ? AND "computed_at" < ? ORDER BY "computed_at" DESC, "id" DESC LIMIT 1) AS "standing"
       UNION ALL
       SELECT "id", "computed_at" FROM "forecast_runs"
         WHERE "reservoir_id" = ? AND "computed_at" >= ? AND "computed_at" <= ?`,
      [reservoirId, fromMs, reservoirId, fromMs, toMs],
    )) as Array<{ id: number; computed_at: number }>;
    return rows
      .map((r) => ({ id: Number(r.id), computedAtMs: Number(r.computed_at) }))
      .sort((a, b) => a.computedAtMs - b.computedAtMs || a.id - b.id);
  }

  /** One stored run's band exactly as stored (never recomputed). */
  async forecast(reservoirId: string, runId: number): Promise<ReplayForecast> {
    this.reservoirs.get(reservoirId);
    const row = await this.dataSource
      .getRepository(ForecastRunRow)
      .findOne({ where: { reservoirId, id: runId } });
    if (!row)
      throw new NotFoundException(`Reservoir "${reservoirId}" has no forecast run ${runId}`);
    const { series } = JSON.parse(row.outputs) as { series: ForecastSeries };
    return {
      id: row.id,
      computedAtMs: Number(row.computedAt),
      trigger: row.trigger,
      startMs: series.startMs,
      stepS: series.stepS,
      elevation: series.elevation,
      p10: series.p10,
      p50: series.p50,
      p90: series.p90,
      peak: {
        elevation: row.peakElevation,
        timeMs: Number(row.peakTime),
        p90: row.peakP90,
      },
      timeLeftStatus: row.timeLeftStatus,
      latestStartMs: row.latestStart === null ? null : Number(row.latestStart),
      caution: REPLAY_FORECAST_CAUTION,
    };
  }
}
