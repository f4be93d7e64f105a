import type { ReplayResolution } from '@stillwell/shared/replay';

export interface ResolutionInput {
  fromMs: number;
  toMs: number;
  /** the reporting interval of each channel asked for, s */
  intervalsS: readonly number[];
  rawMaxRows: number;
  /** raw readings before this are gone */
  prunedThroughMs: number;
}

export interface ResolutionChoice {
  resolution: ReplayResolution;
  expectedRows: number;
  reason: string;
}

const day = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');

/**
 * Raw readings when the window is short enough to read them all; minute aggregates when the raw
 * ones are too many (counted from each channel's reporting interval) or already pruned.
 */
export function chooseResolution(i: ResolutionInput): ResolutionChoice {
  const spanS = (i.toMs - i.fromMs) / 1000;
  const expectedRows = Math.round(i.intervalsS.reduce((n, s) => n + spanS / s, 0));
  if (i.fromMs < i.prunedThroughMs) {
    return {
      resolution: 'minute',
      expectedRows,
      reason: `raw readings before ${day(i.prunedThroughMs)} UTC have been pruned; one-minute aggregates (minimum and maximum of every minute) are kept for ever`,
    };
  }
  if (expectedRows > i.rawMaxRows) {
    return {
      resolution: 'minute',
      expectedRows,
      reason: `the window holds about ${expectedRows.toLocaleString('en')} readings, more than ${i.rawMaxRows.toLocaleString('en')}: one-minute aggregates, with raw readings for the minutes not yet aggregated`,
    };
  }
  return {
    resolution: 'raw',
    expectedRows,
    reason: `the window holds about ${expectedRows.toLocaleString('en')} readings (at most ${i.rawMaxRows.toLocaleString('en')}): the stored readings themselves`,
  };
}
