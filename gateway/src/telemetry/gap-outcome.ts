import type { BackfillReply } from '@stillwell/shared/telemetry';
import type { GapState } from './sequence-gap.entity';

export type UnavailableRun = BackfillReply['unavailable'][number];

/** The part of a gap one request asks for: at most `maxSeqs` sequence numbers from `cursor`. */
export function nextPart(
  cursor: number,
  toSeq: number,
  maxSeqs: number,
): { fromSeq: number; toSeq: number } {
  return { fromSeq: cursor, toSeq: Math.min(toSeq, cursor + maxSeqs - 1) };
}

/** "overrun 10-19; not-held 25": the device's reasons, as stored in the gap row. */
export function describeRuns(runs: readonly UnavailableRun[]): string {
  return runs
    .map((r) => `${r.reason} ${r.fromSeq === r.toSeq ? r.fromSeq : `${r.fromSeq}-${r.toSeq}`}`)
    .join('; ');
}

/** How many sequence numbers of fromSeq..toSeq the runs name (clipped to the gap, no overlaps). */
export function unavailableCount(
  runs: readonly UnavailableRun[],
  fromSeq: number,
  toSeq: number,
): number {
  const sorted = [...runs].sort((a, b) => a.fromSeq - b.fromSeq);
  let counted = 0;
  let next = fromSeq;
  for (const r of sorted) {
    const a = Math.max(r.fromSeq, next);
    const b = Math.min(r.toSeq, toSeq);
    if (a > b) continue;
    counted += b - a + 1;
    next = b + 1;
  }
  return counted;
}

/**
 * What to make of a gap once every part has been asked for: filled when all of it is stored,
 * unavailable when the device said why the rest is gone, otherwise undecided (readings sent again
 * may still be on their way; ask again) until `final`, when it is unanswered.
 */
export function judgeGap(
  gap: { fromSeq: number; toSeq: number },
  stored: number,
  runs: readonly UnavailableRun[],
  final: boolean,
): { state: Exclude<GapState, 'open'>; detail: string | null } | null {
  const size = gap.toSeq - gap.fromSeq + 1;
  const missing = size - stored;
  if (missing <= 0) return { state: 'filled', detail: null };
  if (runs.length && missing <= unavailableCount(runs, gap.fromSeq, gap.toSeq)) {
    return { state: 'unavailable', detail: `${missing} of ${size} gone: ${describeRuns(runs)}` };
  }
  if (!final) return null;
  const said = runs.length ? ` (device said: ${describeRuns(runs)})` : '';
  return { state: 'unanswered', detail: `${missing} of ${size} still missing${said}` };
}
