import type {
  CompareResponse,
  CompareSide,
  ThresholdCrossingView,
} from '@stillwell/shared/forecasts';
import type { UnitSystem } from '@stillwell/shared/units';
import { formatQuantity } from '../../../lib/format';
import { leadText, siteClockText } from './format-time';

/** Which side came out worse on a line (higher pool, sooner crossing), for the eye. */
export type Worse = 'a' | 'b' | null;

export interface ComparisonLine {
  id: string;
  label: string;
  a: string;
  b: string;
  /** b minus a, in words; '' where a difference says nothing */
  difference: string;
  worse: Worse;
}

export interface ComparisonView {
  labelA: string;
  labelB: string;
  lines: ComparisonLine[];
  /** per side: the pool left the storage table (the run stopped there: its peak is a lower bound) */
  warnings: string[];
}

const afterStart = (s: number) => (s < 60 ? 'at the start' : `+${leadText(s)}`);

function momentText(startMs: number, s: number, timeZone: string): string {
  return `${afterStart(s)} (${siteClockText(startMs + s * 1000, timeZone)})`;
}

function signedLead(s: number): string {
  if (Math.abs(s) < 60) return 'same';
  return `${s > 0 ? 'later' : 'earlier'} by ${leadText(s)}`;
}

function crossingText(c: ThresholdCrossingView, startMs: number, timeZone: string): string {
  if (c.alreadyAbove) return 'already above';
  if (c.timeS === null) return 'not reached';
  return momentText(startMs, c.timeS, timeZone);
}

/** Sooner is worse; never reached is best. */
function crossingRank(c: ThresholdCrossingView): number {
  if (c.alreadyAbove) return -1;
  return c.timeS ?? Number.POSITIVE_INFINITY;
}

const worseOf = (a: number, b: number, higherIsWorse: boolean, tolerance: number): Worse => {
  if (a === b || Math.abs(a - b) <= tolerance) return null;
  return a > b === higherIsWorse ? 'a' : 'b';
};

/**
 * The two schedules side by side: peak pool and when, largest release and when, the largest
 * change of release, pool at the end, volume released, then the time to each threshold (and how
 * long above it). Values in the display units, times after the start and in site time.
 */
export function comparisonView(
  result: CompareResponse,
  system: UnitSystem,
  timeZone: string,
): ComparisonView {
  const { a, b, startMs, difference } = result;
  const length = (v: number, signed = false) => {
    const q = formatQuantity(v, 'length', system, { signed });
    return `${q.text} ${q.unitText}`;
  };
  const flow = (v: number, signed = false) => {
    const q = formatQuantity(v, 'flow', system, { signed });
    return `${q.text} ${q.unitText}`;
  };
  const volume = (v: number, signed = false) => {
    const q = formatQuantity(v, 'volume', system, { signed });
    return `${q.text} ${q.unitText}`;
  };
  const per = (side: CompareSide) => side.summary;
  const lines: ComparisonLine[] = [
    {
      id: 'peak',
      label: 'Peak pool elevation',
      a: length(per(a).peakElevation),
      b: length(per(b).peakElevation),
      difference: length(difference.peakElevation, true),
      worse: worseOf(per(a).peakElevation, per(b).peakElevation, true, 0.005),
    },
    {
      id: 'peak-time',
      label: 'Time of peak',
      a: momentText(startMs, per(a).peakElevationTimeS, timeZone),
      b: momentText(startMs, per(b).peakElevationTimeS, timeZone),
      difference: signedLead(difference.peakElevationTimeS),
      worse: null,
    },
    {
      id: 'max-release',
      label: 'Largest release',
      a: `${flow(per(a).peakOutflow)} ${afterStart(per(a).peakOutflowTimeS)}`,
      b: `${flow(per(b).peakOutflow)} ${afterStart(per(b).peakOutflowTimeS)}`,
      difference: flow(difference.peakOutflow, true),
      worse: worseOf(per(a).peakOutflow, per(b).peakOutflow, true, 0.05),
    },
    {
      id: 'release-rate',
      label: 'Fastest change of release',
      a: `${flow(per(a).maxReleaseRate * 60)} per min`,
      b: `${flow(per(b).maxReleaseRate * 60)} per min`,
      difference: '',
      worse: worseOf(per(a).maxReleaseRate, per(b).maxReleaseRate, true, 0.001),
    },
    {
      id: 'final',
      label: 'Pool at the end of the run',
      a: length(per(a).finalElevation),
      b: length(per(b).finalElevation),
      difference: length(difference.finalElevation, true),
      worse: null,
    },
    {
      id: 'volume',
      label: 'Volume released',
      a: volume(per(a).releasedVolume),
      b: volume(per(b).releasedVolume),
      difference: volume(difference.releasedVolume, true),
      worse: null,
    },
  ];
  per(a).thresholds.forEach((ta) => {
    const tb = per(b).thresholds.find((t) => t.id === ta.id);
    if (!tb) return;
    const both = [ta, tb];
    const reached = both.filter((c) => c.alreadyAbove || c.timeS !== null);
    const diff =
      ta.timeS !== null && tb.timeS !== null && !ta.alreadyAbove && !tb.alreadyAbove
        ? signedLead(tb.timeS - ta.timeS)
        : '';
    lines.push({
      id: `threshold-${ta.id}`,
      label: `Time to ${ta.label} (${length(ta.elevation)})`,
      a: crossingText(ta, startMs, timeZone),
      b: crossingText(tb, startMs, timeZone),
      difference: diff,
      worse: reached.length === 0 ? null : worseOf(crossingRank(ta), crossingRank(tb), false, 30),
    });
    if (ta.timeAboveS > 0 || tb.timeAboveS > 0) {
      lines.push({
        id: `above-${ta.id}`,
        label: `Time above ${ta.label}`,
        a: ta.timeAboveS > 0 ? leadText(ta.timeAboveS) : 'none',
        b: tb.timeAboveS > 0 ? leadText(tb.timeAboveS) : 'none',
        difference: '',
        worse: worseOf(ta.timeAboveS, tb.timeAboveS, true, 30),
      });
    }
  });
  const warnings = [a, b].flatMap((side) =>
    side.summary.leftTableAtS === null
      ? []
      : [
          `${side.label}: the pool leaves the top of the storage table ${afterStart(side.summary.leftTableAtS)}; the run stops there and its peak is a lower bound.`,
        ],
  );
  return { labelA: a.label, labelB: b.label, lines, warnings };
}
