import type { ReservoirDefinition, Threshold } from '@stillwell/shared/reservoirs';
import { assertUnreachable } from '../../../lib/assert';
import { worse, type Severity } from '../../../lib/severity';

export function severityOfKind(kind: Threshold['kind']): Severity {
  switch (kind) {
    case 'spillway-crest':
      // A gated crest sits below the normal pool: being above it is ordinary.
      return 'normal';
    case 'alert':
      return 'caution';
    case 'auxiliary-spillway':
    case 'crest-less-freeboard':
    case 'dam-crest':
      return 'alarm';
    default:
      return assertUnreachable(kind);
  }
}

export interface PoolStanding {
  severity: Severity;
  /** the highest threshold the pool is above, if any */
  exceeded: Threshold | null;
}

/** Where the pool stands against the thresholds: above one means strictly above it. */
export function poolStanding(elevation: number, thresholds: readonly Threshold[]): PoolStanding {
  let severity: Severity = 'normal';
  let exceeded: Threshold | null = null;
  for (const threshold of thresholds) {
    if (elevation <= threshold.elevation) continue;
    severity = worse(severity, severityOfKind(threshold.kind));
    if (!exceeded || threshold.elevation > exceeded.elevation) exceeded = threshold;
  }
  return { severity, exceeded };
}

export function freeboardSeverity(freeboard: number, definition: ReservoirDefinition): Severity {
  return freeboard < definition.requiredFreeboard ? 'alarm' : 'normal';
}

export interface LevelMark {
  id: string;
  label: string;
  /** SI elevation */
  elevation: number;
  kind: Threshold['kind'];
}

/** The thresholds and the dam crest, low to high; the crest once even if also listed as a threshold. */
export function levelMarks(definition: ReservoirDefinition): LevelMark[] {
  const marks: LevelMark[] = definition.thresholds.map((t) => ({ ...t }));
  const crestListed = marks.some(
    (m) => m.kind === 'dam-crest' && m.elevation === definition.damCrestElevation,
  );
  if (!crestListed) {
    marks.push({
      id: 'dam-crest',
      label: 'Dam crest',
      elevation: definition.damCrestElevation,
      kind: 'dam-crest',
    });
  }
  return marks.sort((a, b) => a.elevation - b.elevation);
}

/**
 * The elevation range (SI) the pool scale and the chart show: every threshold and the dam crest,
 * and the pool wherever it is, with a little room around.
 */
export function levelRange(definition: ReservoirDefinition, pool: number | null): [number, number] {
  const elevations = levelMarks(definition).map((m) => m.elevation);
  if (pool !== null && Number.isFinite(pool)) elevations.push(pool);
  const lo = Math.min(...elevations);
  const hi = Math.max(...elevations);
  return [Math.floor(lo - 1), Math.ceil(hi + 0.5)];
}
