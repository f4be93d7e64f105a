import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { UnitSystem } from '@stillwell/shared/units';
import { formatQuantity } from '../../../lib/format';
import type { Severity } from '../../../lib/severity';
import { levelMarks, levelRange, severityOfKind } from './thresholds';

export interface GaugeMark {
  id: string;
  label: string;
  /** display units */
  value: number;
  text: string;
  severity: Severity;
  /** the pool is above it */
  exceeded: boolean;
  crest: boolean;
}

export interface GaugeModel {
  /** display units, low to high */
  range: [number, number];
  ticks: number[];
  tickTexts: string[];
  marks: GaugeMark[];
  unitText: string;
  pool: { value: number; text: string } | null;
}

const STEPS = [0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50, 100];

/** A round tick step giving about `count` ticks over the span. */
export function niceStep(span: number, count = 8): number {
  const raw = span / count;
  return STEPS.find((step) => step >= raw) ?? STEPS[STEPS.length - 1] ?? 1;
}

/** The pool scale in display units: range, ticks, and every threshold with the dam crest. */
export function buildGaugeModel(
  definition: ReservoirDefinition,
  pool: number | null,
  system: UnitSystem,
): GaugeModel {
  const show = (si: number) => formatQuantity(si, 'length', system);
  const [loSi, hiSi] = levelRange(definition, pool);
  const lo = show(loSi).value;
  const hi = show(hiSi).value;
  const step = niceStep(hi - lo);
  const ticks: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9; v += step) {
    ticks.push(Number(v.toFixed(6)));
  }
  const decimals = step < 1 ? 1 : 0;
  return {
    range: [lo, hi],
    ticks,
    tickTexts: ticks.map((t) => t.toFixed(decimals)),
    unitText: show(0).unitText,
    marks: levelMarks(definition).map((mark) => {
      const shown = show(mark.elevation);
      return {
        id: mark.id,
        label: mark.label,
        value: shown.value,
        text: shown.text,
        severity: severityOfKind(mark.kind),
        exceeded: pool !== null && pool > mark.elevation,
        crest: mark.kind === 'dam-crest',
      };
    }),
    pool: pool === null ? null : { value: show(pool).value, text: show(pool).text },
  };
}

/**
 * Moves label positions (ascending, in px) apart by at least `gap` within [top, bottom], keeping
 * each as near its own line as it can.
 */
export function spreadLabels(ys: readonly number[], gap: number, top: number, bottom: number) {
  const out = [...ys];
  for (let i = 1; i < out.length; i += 1) {
    out[i] = Math.max(out[i] ?? 0, (out[i - 1] ?? 0) + gap);
  }
  for (let i = out.length - 1; i >= 0; i -= 1) {
    const limit = i === out.length - 1 ? bottom : (out[i + 1] ?? bottom) - gap;
    out[i] = Math.max(top, Math.min(out[i] ?? 0, limit));
  }
  return out;
}
