import type { ReplayResolution } from '@stillwell/shared/replay';

export interface ResolutionInput {
  fromMs: number;
  toMs: number;
  /** the reporting interval of each channel asked for, s */
  intervalsS: readonly number[];
  rawMaxRows: number;
  minuteMaxRows: number;
  /** raw readings before this are gone */
  prunedThroughMs: number;
}

export interface ResolutionChoice {
  resolution: ReplayResolution;
  expectedRows: number;
  reason: string;
}

const day = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');
const n = (x: number) => x.toLocaleString('en');

/**
 * Raw readings when the window is short enough to read them all (counted from each channel's
 * reporting interval) and still kept; otherwise one-minute aggregates; and hourly roll-ups when
 * even the minutes are too many to read quickly. Each level keeps the extremes of its buckets.
 */
export function chooseResolution(i: ResolutionInput): ResolutionChoice {
  const spanS = (i.toMs - i.fromMs) / 1000;
  const expectedRows = Math.round(i.intervalsS.reduce((sum, s) => sum + spanS / s, 0));
  const minuteRows = Math.ceil(spanS / 60) * i.intervalsS.length;
  const pruned = i.fromMs < i.prunedThroughMs;
  const why = pruned
    ? `raw readings before ${day(i.prunedThroughMs)} UTC have been pruned`
    : `the window holds about ${n(expectedRows)} readings, more than ${n(i.rawMaxRows)}`;
  if (!pruned && expectedRows <= i.rawMaxRows) {
    return {
      resolution: 'raw',
      expectedRows,
      reason: `the window holds about ${n(expectedRows)} readings (at most ${n(i.rawMaxRows)}): the stored readings themselves`,
    };
  }
  if (minuteRows <= i.minuteMaxRows) {
    return {
      resolution: 'minute',
      expectedRows,
      reason: `${why}: one-minute aggregates (minimum and maximum of every minute, kept for ever), with raw readings for the minutes not yet aggregated`,
    };
  }
  return {
    resolution: 'hour',
    expectedRows,
    reason: `${why}, and its ${n(minuteRows)} minute aggregates more than ${n(i.minuteMaxRows)}: hourly roll-ups (minimum and maximum of every hour), minutes and raw readings at the edges`,
  };
}
