import { totalOutflow, type OutletSettings } from '../hydraulics/discharge.js';
import type { ReservoirDefinition } from '../reservoirs/definition.js';
import type { OrderControl } from './controls.js';

/** Openings by control id (m for gates, % for valves). */
export type Openings = Readonly<Record<string, number>>;

export function settingsOf(controls: readonly OrderControl[], openings: Openings): OutletSettings {
  const settings: OutletSettings = { gates: {}, valves: {} };
  for (const c of controls) {
    const v = openings[c.id];
    if (v === undefined) continue;
    if (c.kind === 'gate') settings.gates[c.id] = v;
    else settings.valves[c.id] = v;
  }
  return settings;
}

/** Release through every structure at a pool level with these openings, m3/s. */
export function releaseAt(
  definition: ReservoirDefinition,
  controls: readonly OrderControl[],
  pool: number,
  openings: Openings,
): number {
  return totalOutflow(definition.structures, pool, settingsOf(controls, openings));
}

export interface ReleaseRamp {
  /** m3/s before and after the move, at the present pool */
  from: number;
  to: number;
  /** how long the slowest control travels, s */
  travelS: number;
  /** the steepest change of release during the move, m3/s per minute (signed: + rising) */
  steepestPerMin: number;
}

const SAMPLES = 60;

/**
 * How the release changes while the controls travel from `current` to `targets` at their own
 * speeds, all starting together, at the present pool level (the pool's own change over a move of
 * minutes is small next to the gate's). The steepest part matters: several gates moving at once
 * raise the release faster than any one of them.
 */
export function releaseRamp(
  definition: ReservoirDefinition,
  controls: readonly OrderControl[],
  pool: number,
  current: Openings,
  targets: Openings,
): ReleaseRamp {
  const moving = controls.filter(
    (c) => targets[c.id] !== undefined && targets[c.id] !== (current[c.id] ?? 0),
  );
  const at = (t: number): Openings => {
    const o: Record<string, number> = { ...current };
    for (const c of moving) {
      const from = current[c.id] ?? 0;
      const to = targets[c.id]!;
      const step = c.travelSpeed * t;
      o[c.id] = Math.abs(to - from) <= step ? to : from + Math.sign(to - from) * step;
    }
    return o;
  };
  const travelS = Math.max(
    0,
    ...moving.map((c) => Math.abs(targets[c.id]! - (current[c.id] ?? 0)) / c.travelSpeed),
  );
  const from = releaseAt(definition, controls, pool, current);
  const to = releaseAt(definition, controls, pool, at(travelS));
  if (travelS === 0) return { from, to, travelS, steepestPerMin: 0 };
  let steepest = 0;
  let previous = from;
  const dt = travelS / SAMPLES;
  for (let i = 1; i <= SAMPLES; i++) {
    const q = releaseAt(definition, controls, pool, at(i * dt));
    const rate = ((q - previous) / dt) * 60;
    if (Math.abs(rate) > Math.abs(steepest)) steepest = rate;
    previous = q;
  }
  return { from, to, travelS, steepestPerMin: steepest };
}
