import { z } from 'zod';

/**
 * The checks the gateway makes before it sends a command. Each refusal names the gate, the
 * figures and what the operator can do about it.
 */
export const INTERLOCK_CODES = [
  'link-down',
  'telemetry-stale',
  'gate-moving',
  'target-out-of-limits',
  'release-rate',
  'downstream-clearance',
] as const;
export const interlockCodeSchema = z.enum(INTERLOCK_CODES);
export type InterlockCode = z.infer<typeof interlockCodeSchema>;

export interface InterlockRule {
  title: string;
  /** what it protects against, for the console and docs/operations.md */
  why: string;
  /**
   * Under a declared emergency this check is recorded as a warning instead of refusing: the
   * emergency action plan, not the routine limit, then governs. The others still refuse, because
   * without them the command could not be sent or confirmed safely.
   */
  waivedInEmergency: boolean;
}

export const INTERLOCKS: Readonly<Record<InterlockCode, InterlockRule>> = {
  'link-down': {
    title: 'Broker link',
    why: 'the gateway must be connected to the broker to send a command and hear its acknowledgement',
    waivedInEmergency: false,
  },
  'telemetry-stale': {
    title: 'Fresh telemetry',
    why: 'the gate position and the pool must be known now, or the move cannot be confirmed',
    waivedInEmergency: false,
  },
  'gate-moving': {
    title: 'Gate at rest',
    why: 'a gate that is already moving (another order, an automatic rule) must stop first',
    waivedInEmergency: false,
  },
  'target-out-of-limits': {
    title: 'Within limits',
    why: "the target must lie within the gate's travel (0 to fully open)",
    waivedInEmergency: false,
  },
  'release-rate': {
    title: 'Rate of change of release',
    why: 'the release must not rise or fall faster than the allowed rate, for people downstream',
    waivedInEmergency: true,
  },
  'downstream-clearance': {
    title: 'Downstream told',
    why: 'required downstream notices must be sent and their lead time run before a release',
    waivedInEmergency: true,
  },
};

export const interlockResultSchema = z.strictObject({
  code: interlockCodeSchema,
  ok: z.boolean(),
  /** a plain sentence: what is wrong and what to do; or, when ok, what was checked */
  message: z.string(),
  /** true when it failed but a declared emergency waived it (recorded, flagged) */
  waived: z.boolean(),
});
export type InterlockResult = z.infer<typeof interlockResultSchema>;

export const interlockReportSchema = z.strictObject({
  /** true when nothing refuses (waived checks do not refuse) */
  ok: z.boolean(),
  checkedAt: z.string(),
  results: z.array(interlockResultSchema),
});
export type InterlockReport = z.infer<typeof interlockReportSchema>;

/** Builds the report from the checks' outcomes. */
export function interlockReport(
  outcomes: ReadonlyArray<{ code: InterlockCode; ok: boolean; message: string }>,
  emergency: boolean,
  checkedAt: string,
): InterlockReport {
  const results = outcomes.map((o) => ({
    ...o,
    waived: !o.ok && emergency && INTERLOCKS[o.code].waivedInEmergency,
  }));
  return { ok: results.every((r) => r.ok || r.waived), checkedAt, results };
}

/** The refusals of a report, as one sentence each. */
export function refusalsOf(report: InterlockReport): InterlockResult[] {
  return report.results.filter((r) => !r.ok && !r.waived);
}
