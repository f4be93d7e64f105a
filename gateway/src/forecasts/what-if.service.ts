import { BadRequestException, Injectable } from '@nestjs/common';
import {
  compareSchedules,
  compileOutflow,
  createStorageCurve,
  parseHydrographCsv,
  routeStorageIndication,
  seriesFromPoints,
  summarize,
  type FlowPoint,
  type OutletSettings,
  type RoutingOptions,
  type RoutingResult,
  type ScheduleSummary,
} from '@stillwell/shared/hydraulics';
import {
  FORECAST_CAUTION,
  WHAT_IF_LIMITS,
  checkScheduleRows,
  problemLines,
  type CompareResponse,
  type RouteSummary,
  type RoutedSeries,
  type ScheduleRow,
  type TableProblem,
  type WhatIfResponse,
} from '@stillwell/shared/forecasts';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { StatusService } from '../telemetry/status.service';
import type { CompareRequestDto, WhatIfBaseDto, WhatIfRequestDto } from './dto/what-if.dto';
import { ForecastInputsService } from './forecast-inputs.service';
import { forecastLevels, type Level } from './levels';

/** Numeric CSV times this large are date-times (epoch s): no hydrograph runs for 31 years. */
const EPOCH_S = 1e9;
/** at most this many points per series in an answer */
const MAX_POINTS = 1000;

function refuse(lines: string[]): never {
  throw new BadRequestException({ statusCode: 400, error: 'Bad Request', message: lines });
}

interface Prepared {
  options: RoutingOptions;
  levels: Level[];
  common: Omit<WhatIfResponse, 'series' | 'summary'>;
}

/**
 * What-if routing for people: an inflow hydrograph and gate schedules, routed from the current
 * pool (or a given one) with the same engine as the live forecast. Nothing is stored: a what-if is
 * a question, not a record (a decision made on it is recorded where it is made).
 */
@Injectable()
export class WhatIfService {
  constructor(
    private readonly reservoirs: ReservoirsService,
    private readonly status: StatusService,
    private readonly inputs: ForecastInputsService,
  ) {}

  route(reservoirId: string, dto: WhatIfRequestDto): WhatIfResponse {
    const p = this.prepare(reservoirId, dto, [['schedule', dto.schedule]]);
    const r = routeStorageIndication({ ...p.options, schedule: p.options.schedule });
    return {
      ...p.common,
      series: seriesOf(r),
      summary: summaryOf(summarize(r, p.levels), p.levels),
    };
  }

  compare(reservoirId: string, dto: CompareRequestDto): CompareResponse {
    const p = this.prepare(reservoirId, dto, [
      ['scheduleA', dto.scheduleA],
      ['scheduleB', dto.scheduleB],
    ]);
    const c = compareSchedules(
      { ...p.options, schedule: [] },
      dto.scheduleA,
      dto.scheduleB,
      p.levels,
    );
    return {
      ...p.common,
      a: { label: dto.labelA, series: seriesOf(c.results.a), summary: summaryOf(c.a, p.levels) },
      b: { label: dto.labelB, series: seriesOf(c.results.b), summary: summaryOf(c.b, p.levels) },
      difference: {
        peakElevation: c.difference.peakElevation,
        peakElevationTimeS: c.difference.peakElevationTime,
        peakOutflow: c.difference.peakOutflow,
        finalElevation: c.difference.finalElevation,
        releasedVolume: c.difference.releasedVolume,
      },
    };
  }

  private prepare(
    reservoirId: string,
    dto: WhatIfBaseDto,
    schedules: [string, ScheduleRow[]][],
  ): Prepared {
    const { definition, version } = this.reservoirs.get(reservoirId);
    const model = compileOutflow(definition.structures);
    const controls = model.controls.map((c) => ({ id: c.id, kind: c.kind, max: c.max }));
    const problems: TableProblem[] = schedules.flatMap(([field, rows]) =>
      checkScheduleRows(rows, field, controls),
    );
    const notes: string[] = [];
    const status = this.status.status(reservoirId);
    let startMs = status.clock.now;
    const { points, absolute } = this.inflowOf(dto);
    if (absolute) {
      startMs = points[0]!.t * 1000;
      notes.push('the hydrograph carries date-times: the run starts at its first point');
    }
    const t0 = absolute ? points[0]!.t : 0;
    const relative: FlowPoint[] = points.map((p) => ({ t: p.t - t0, q: p.q }));

    const storage = createStorageCurve(definition.storageTable);
    let startElevation = dto.startElevation;
    if (startElevation === undefined) {
      if (!status.pool) refuse(['startElevation: give one: there is no usable pool reading now']);
      startElevation = status.pool.elevation;
    }
    if (!(startElevation >= storage.minElevation && startElevation <= storage.maxElevation))
      refuse([
        `startElevation: ${startElevation} m is outside the storage table (${storage.minElevation} to ${storage.maxElevation} m)`,
      ]);

    let initial: OutletSettings;
    if (dto.initialOpenings) {
      initial = { gates: {}, valves: {} };
      dto.initialOpenings.forEach((o, i) => {
        const c = controls.find((x) => x.id === o.id);
        const where = `initialOpenings row ${i + 1}`;
        if (!c)
          problems.push({
            field: 'initialOpenings',
            row: i + 1,
            message: `${where} (id): no gate or valve "${o.id}"`,
          });
        else if (o.opening > c.max)
          problems.push({
            field: 'initialOpenings',
            row: i + 1,
            message: `${where} (opening): ${o.opening} is above the largest opening ${c.max}`,
          });
        else if (c.kind === 'gate') initial.gates[c.id] = o.opening;
        else initial.valves[c.id] = o.opening;
      });
    } else {
      const current = this.inputs.currentOpenings(definition, status);
      initial = current.settings;
      if (current.missing.length)
        notes.push(`no usable reading for ${current.missing.join(', ')}: closed at the start`);
    }
    if (problems.length) refuse(problemLines(problems));

    const dt = dto.dtS ?? 60;
    const span = relative[relative.length - 1]!.t;
    const wanted =
      dto.durationS ??
      Math.min(Math.max(span, WHAT_IF_LIMITS.defaultDurationS), WHAT_IF_LIMITS.maxDurationS);
    // the engine wants a whole number of steps
    const duration = Math.ceil(wanted / dt - 1e-9) * dt;
    if (span < duration && relative.length > 0)
      notes.push('the hydrograph ends before the run does: its last flow is held');
    notes.push('free outfall: no tailwater is assumed');
    const levels = forecastLevels(definition);
    return {
      options: {
        storage,
        structures: definition.structures,
        inflow: seriesFromPoints(relative),
        initialElevation: startElevation,
        initialSettings: initial,
        start: 0,
        duration,
        dt,
        aboveTable: 'stop',
        schedule: schedules.length === 1 ? schedules[0]![1] : [],
      },
      levels,
      common: {
        startMs,
        startElevation,
        initialOpenings: { ...initial.gates, ...initial.valves },
        durationS: duration,
        dtS: dt,
        definitionVersion: version,
        notes,
        caution: FORECAST_CAUTION,
      },
    };
  }

  private inflowOf(dto: WhatIfBaseDto): { points: FlowPoint[]; absolute: boolean } {
    if ((dto.inflow === undefined) === (dto.inflowCsv === undefined))
      refuse(['inflow: give the hydrograph either as rows (inflow) or as CSV text (inflowCsv)']);
    if (dto.inflow) return { points: dto.inflow, absolute: false };
    const parsed = parseHydrographCsv(dto.inflowCsv!, { timeUnit: dto.inflowTimeUnit });
    if (parsed.problems.length)
      refuse(parsed.problems.slice(0, 20).map((p) => `inflowCsv ${p.message}`));
    const absolute = parsed.points[0]!.t >= EPOCH_S;
    if (!absolute && parsed.points[0]!.t < 0)
      refuse(['inflowCsv: times must not be negative (they count from the start of the run)']);
    return { points: parsed.points, absolute };
  }
}

function seriesOf(r: RoutingResult): RoutedSeries {
  const stride = Math.max(1, Math.ceil(r.time.length / MAX_POINTS));
  const pick = (a: Float64Array, round: number) => {
    const out: number[] = [];
    for (let i = 0; i < a.length; i += stride) out.push(Math.round(a[i]! * round) / round);
    // the last step always, so the chart reaches the end of the run
    if ((a.length - 1) % stride !== 0) out.push(Math.round(a[a.length - 1]! * round) / round);
    return out;
  };
  return {
    t: pick(r.time, 1),
    inflow: pick(r.inflow, 100),
    elevation: pick(r.elevation, 1000),
    outflow: pick(r.outflow, 100),
  };
}

function summaryOf(s: ScheduleSummary, levels: Level[]): RouteSummary {
  return {
    peakElevation: s.peakElevation,
    peakElevationTimeS: s.peakElevationTime,
    peakOutflow: s.peakOutflow,
    peakOutflowTimeS: s.peakOutflowTime,
    finalElevation: s.finalElevation,
    releasedVolume: s.releasedVolume,
    maxReleaseRate: s.maxReleaseRate,
    thresholds: s.thresholds.map((c, i) => ({
      id: c.id,
      label: levels[i]!.label,
      kind: levels[i]!.kind,
      elevation: c.elevation,
      timeS: c.time,
      alreadyAbove: c.alreadyAbove,
      timeAboveS: c.timeAbove,
    })),
    leftTableAtS: s.leftTableAt,
  };
}
