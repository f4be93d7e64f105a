import { TABLE_LIMITS, type ForecastRun, type ScheduleControl } from '@stillwell/shared/forecasts';
import { parseHydrographCsv } from '@stillwell/shared/hydraulics';
import { controlsOf, type OrderControl } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';

/**
 * The tables of the what-if page as the grids edit them. Times are hours from the start of the run
 * on screen (seconds in the request); an empty cell is null, so the shared row checks can say
 * "empty" for it rather than the grid inventing a value.
 */
export interface HydrographRow {
  id: number;
  /** h from the start */
  hour: number | null;
  /** m3/s */
  flow: number | null;
}

export interface ScheduleGridRow {
  id: number;
  /** h from the start */
  hour: number | null;
  /** gate or valve id ('' until one is chosen) */
  control: string;
  /** m for a gate, % for a valve */
  target: number | null;
}

export interface ScheduleDraft {
  name: string;
  rows: ScheduleGridRow[];
}

let lastId = 0;
/** Grid row ids: unique within the page's life, never reused after a delete. */
export const nextRowId = (): number => ++lastId;

/** The gates and valves a schedule may name, in the reservoir's order. */
export function scheduleControls(definition: ReservoirDefinition): OrderControl[] {
  return controlsOf(definition);
}

export const asScheduleControls = (controls: readonly OrderControl[]): ScheduleControl[] =>
  controls.map((c) => ({ id: c.id, kind: c.kind, max: c.max }));

/** Hours to whole milliseconds of seconds, so 0.1 h is 360 s and not 360.00000000000006 s. */
export const hoursToSeconds = (hour: number): number => Math.round(hour * 3_600_000) / 1000;

/**
 * A sample flood to start from when nothing better is at hand: 300 m3/s rising to 1,900 m3/s at
 * hour 6 and back to 300 m3/s at hour 24 (the size of the demo storm's peak).
 */
export function sampleHydrograph(): HydrographRow[] {
  return [
    [0, 300],
    [6, 1900],
    [24, 300],
  ].map(([hour, flow]) => ({ id: nextRowId(), hour: hour!, flow: flow! }));
}

/** Every spillway gate fully open from `hour`: the schedule a comparison starts from. */
export function openAllGates(controls: readonly OrderControl[], hour: number): ScheduleGridRow[] {
  return controls
    .filter((c) => c.kind === 'gate')
    .map((c) => ({ id: nextRowId(), hour, control: c.id, target: c.max }));
}

/** "Open now" against "Open in 3 hours": the comparison the page opens with. */
export function defaultSchedules(controls: readonly OrderControl[]): {
  a: ScheduleDraft;
  b: ScheduleDraft;
} {
  return {
    a: { name: 'Open now', rows: openAllGates(controls, 0) },
    b: { name: 'Open in 3 hours', rows: openAllGates(controls, 3) },
  };
}

export function emptyHydrographRow(after: HydrographRow | undefined): HydrographRow {
  return {
    id: nextRowId(),
    hour: after?.hour != null ? after.hour + 1 : 0,
    flow: after?.flow ?? null,
  };
}

export function emptyScheduleRow(
  after: ScheduleGridRow | undefined,
  controls: readonly OrderControl[],
): ScheduleGridRow {
  return {
    id: nextRowId(),
    hour: after?.hour ?? 0,
    control: after?.control ?? controls[0]?.id ?? '',
    target: after?.target ?? 0,
  };
}

export type CsvTimeUnit = 's' | 'min' | 'h';

export interface CsvImport {
  /** the rows to put in the grid; empty when the file is refused */
  rows: HydrographRow[];
  /** one line per problem, each naming the file's row (the header is row 1) and column */
  problems: string[];
  /** something to say about how the file was read, when not obvious */
  note: string | null;
}

/** Numeric CSV times this large are date-times (epoch s), as the gateway reads them. */
const EPOCH_S = 1e9;

/**
 * A hydrograph file read with the shared parser (the one the gateway runs on an uploaded CSV), so
 * a file refused here is refused there with the same row numbers. Date-times count from the file's
 * first point. A file with any problem is refused whole: half a hydrograph would route a different
 * storm without saying so.
 */
export function hydrographFromCsv(text: string, timeUnit: CsvTimeUnit): CsvImport {
  const parsed = parseHydrographCsv(text, { timeUnit });
  if (parsed.problems.length > 0)
    return { rows: [], problems: parsed.problems.map((p) => p.message), note: null };
  const points = parsed.points;
  if (points.length > TABLE_LIMITS.flowRows)
    return {
      rows: [],
      problems: [`at most ${TABLE_LIMITS.flowRows} rows (${points.length} in the file)`],
      note: null,
    };
  const absolute = points[0]!.t >= EPOCH_S;
  if (!absolute && points[0]!.t < 0)
    return {
      rows: [],
      problems: ['row 2: times must not be negative (they count from the start of the run)'],
      note: null,
    };
  const t0 = absolute ? points[0]!.t : 0;
  return {
    rows: points.map((p) => ({
      id: nextRowId(),
      hour: Math.round(((p.t - t0) / 3600) * 1e6) / 1e6,
      flow: p.q,
    })),
    problems: [],
    note: absolute
      ? `The file carries date-times: its first point (${new Date(t0 * 1000).toISOString()}) is taken as the start of the run.`
      : null,
  };
}

/** At most this many rows from a forecast: a grid page, enough for a smooth forecast inflow. */
export const FORECAST_ROWS = 97;

/**
 * The live forecast's base inflow as hydrograph rows, thinned to at most `maxRows` evenly spaced
 * points (its first and last kept), hours from the forecast's start.
 */
export function hydrographFromForecast(run: ForecastRun, maxRows = FORECAST_ROWS): HydrographRow[] {
  const { inflow, stepS } = run.series;
  const n = inflow.length;
  if (n === 0) return [];
  const stride = Math.max(1, Math.ceil((n - 1) / Math.max(1, maxRows - 1)));
  const picked: number[] = [];
  for (let i = 0; i < n; i += stride) picked.push(i);
  if (picked.at(-1) !== n - 1) picked.push(n - 1);
  return picked
    .filter((i) => Number.isFinite(inflow[i]))
    .map((i) => ({
      id: nextRowId(),
      hour: Math.round(((i * stepS) / 3600) * 1e6) / 1e6,
      flow: Math.round(inflow[i]! * 10) / 10,
    }));
}
