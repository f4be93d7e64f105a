import type { ReservoirDefinition, ThresholdKind } from '@stillwell/shared/reservoirs';

/** A level the forecast reports against: a threshold of the definition or a crest derived from it. */
export interface Level {
  id: string;
  label: string;
  kind: ThresholdKind;
  elevation: number;
}

/**
 * The levels every forecast reports time-to and time-above for: the definition's thresholds, plus
 * the crests of its spillways and the dam crest less the required freeboard when the thresholds
 * do not list them already (an operator should not lose a crest because an administrator forgot
 * to repeat it as a threshold). Low to high.
 */
export function forecastLevels(def: ReservoirDefinition): Level[] {
  const levels: Level[] = def.thresholds.map((t) => ({ ...t }));
  const listed = (kind: ThresholdKind, elevation: number) =>
    levels.some((l) => l.kind === kind && Math.abs(l.elevation - elevation) < 1e-6);
  for (const s of def.structures) {
    if (s.kind === 'gated-spillway' || s.kind === 'ogee-crest') {
      if (!listed('spillway-crest', s.crestElevation))
        levels.push({
          id: `crest-${s.id}`,
          label: `${s.name} crest`,
          kind: 'spillway-crest',
          elevation: s.crestElevation,
        });
    } else if (s.kind === 'broad-crested-weir') {
      if (!listed('auxiliary-spillway', s.crestElevation))
        levels.push({
          id: `crest-${s.id}`,
          label: `${s.name} crest`,
          kind: 'auxiliary-spillway',
          elevation: s.crestElevation,
        });
    }
  }
  const target = freeboardTarget(def);
  if (!listed('crest-less-freeboard', target.elevation)) levels.push(target);
  if (!listed('dam-crest', def.damCrestElevation))
    levels.push({
      id: 'dam-crest',
      label: 'Dam crest',
      kind: 'dam-crest',
      elevation: def.damCrestElevation,
    });
  return levels.sort((a, b) => a.elevation - b.elevation);
}

/**
 * The level the decisions keep the peak at or below: the definition's crest-less-freeboard
 * threshold (the lowest, if several), else the dam crest less the required freeboard.
 */
export function freeboardTarget(def: ReservoirDefinition): Level {
  const listed = def.thresholds
    .filter((t) => t.kind === 'crest-less-freeboard')
    .sort((a, b) => a.elevation - b.elevation)[0];
  if (listed) return { ...listed };
  return {
    id: 'crest-less-freeboard',
    label: 'Dam crest less freeboard',
    kind: 'crest-less-freeboard',
    elevation: def.damCrestElevation - def.requiredFreeboard,
  };
}

/** The spillway gates the standard plan opens, and the opening it commands (m). */
export function standardPlanGates(
  def: ReservoirDefinition,
  fraction: number,
): { gates: string[]; opening: number; maxOpening: number } {
  const gates = def.structures.flatMap((s) => (s.kind === 'gated-spillway' ? s.gates : []));
  // One common opening for every gate: the smallest gate's largest opening bounds it.
  const maxOpening = gates.length ? Math.min(...gates.map((g) => g.maxOpening)) : 0;
  return {
    gates: gates.map((g) => g.id),
    opening: Math.round(maxOpening * fraction * 1000) / 1000,
    maxOpening,
  };
}
