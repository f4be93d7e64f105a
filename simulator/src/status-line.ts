import type { ReservoirPlant } from './plant/reservoir-plant.js';

const hhmm = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');

/** One log line: plant time, pool, inflow, outflow and the gates. */
export function describeState(plant: ReservoirPlant, slippedS: number): string {
  const s = plant.state;
  const gates = Object.values(s.settings.gates)
    .map((g) => g.toFixed(2))
    .join('/');
  const valves = Object.values(s.settings.valves)
    .map((v) => `${v.toFixed(0)} %`)
    .join('/');
  const behind =
    slippedS > 0 ? `; running late by ${Math.round(slippedS)} plant s (could not keep up)` : '';
  return (
    `plant ${hhmm(s.timeMs)}Z (h ${plant.hourAt(s.timeMs).toFixed(1)}): pool ${s.pool.toFixed(2)} m, ` +
    `inflow ${s.inflow.toFixed(0)} m3/s, outflow ${s.outflow.toFixed(0)} m3/s, ` +
    `gates ${gates} m, outlet ${valves}${behind}`
  );
}
