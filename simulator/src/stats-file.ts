import { renameSync, writeFileSync } from 'node:fs';
import type { SimulationStats } from './simulation.js';

/** Writes the ledger whole or not at all (a reader never sees half a file). */
export function writeStats(path: string, stats: SimulationStats): void {
  const partial = `${path}.partial`;
  writeFileSync(partial, `${JSON.stringify(stats, null, 2)}\n`);
  renameSync(partial, path);
}
