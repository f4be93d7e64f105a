import {
  checkStepsAgainst,
  controlsOf,
  createOrderRequestSchema,
  type CreateOrderRequest,
  type OrderControl,
} from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';

/** The draft form: one row per step, one (possibly empty) target per gate or valve. */
export interface DraftStepValues {
  offsetMin: string;
  /** control id -> typed target; empty: this step leaves it where it is */
  targets: Record<string, string>;
}

export interface DraftValues {
  steps: DraftStepValues[];
  reason: string;
  /** minutes from now the operator means to execute it */
  startInMin: string;
}

export const emptyStep = (
  offsetMin: number,
  controls: readonly OrderControl[],
): DraftStepValues => ({
  offsetMin: String(offsetMin),
  targets: Object.fromEntries(controls.map((c) => [c.id, ''])),
});

export function emptyDraft(definition: ReservoirDefinition): DraftValues {
  return { steps: [emptyStep(0, controlsOf(definition))], reason: '', startInMin: '0' };
}

const number = (s: string) => (s.trim() === '' ? NaN : Number(s));

/** What the form would send; numbers as typed (the schema says what is wrong with them). */
export function toRequest(values: DraftValues, siteNowMs: number): CreateOrderRequest {
  const start = number(values.startInMin);
  return {
    steps: values.steps.map((s) => ({
      offsetMin: number(s.offsetMin),
      targets: Object.entries(s.targets)
        .filter(([, v]) => v.trim() !== '')
        .map(([control, v]) => ({ control, target: number(v) })),
    })),
    reason: values.reason,
    plannedStart: new Date(siteNowMs + (Number.isFinite(start) ? start : 0) * 60_000).toISOString(),
  };
}

/**
 * Every problem of the draft, each naming its field as the gateway would: the same shared schema
 * and limit checks the gateway enforces, run here only so the operator sees them before sending.
 */
export function draftProblems(
  request: CreateOrderRequest,
  definition: ReservoirDefinition,
): string[] {
  const parsed = createOrderRequestSchema.safeParse(request);
  const problems = parsed.success
    ? []
    : parsed.error.issues.map((i) => `${i.path.join('.') || 'order'}: ${i.message}`);
  for (const p of checkStepsAgainst(definition, request.steps))
    problems.push(`${p.path}: ${p.message}`);
  return problems;
}

/** "Gate 1 to 2.00 m, Low-level outlet valve to 40.0 %" */
export function describeTargets(
  targets: ReadonlyArray<{ control: string; target: number }>,
  controls: readonly OrderControl[],
): string {
  return targets
    .map((t) => {
      const c = controls.find((x) => x.id === t.control);
      const unit = c?.unit ?? '';
      return `${c?.label.replace(/ \(.*\)$/, '') ?? t.control} to ${t.target.toFixed(unit === 'm' ? 2 : 1)} ${unit}`;
    })
    .join(', ');
}
