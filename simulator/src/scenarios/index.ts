import { DEMO_STORM } from './demo-storm.js';
import type { Scenario } from './scenario.js';

export * from './scenario.js';
export { DEMO_STORM } from './demo-storm.js';
export { inflowAt, rainAt, pulseAt } from './hydrograph.js';
export { parseFault, activeFault, checkFault } from './faults.js';
export { parseLeak, leakFlow, LEAK_DEFAULTS } from './leak.js';

/** Scenarios the command line can name. */
export const SCENARIOS: Readonly<Record<string, Scenario>> = { [DEMO_STORM.id]: DEMO_STORM };

export function findScenario(id: string): Scenario {
  const found = SCENARIOS[id];
  if (!found) {
    throw new RangeError(`no scenario "${id}"; known: ${Object.keys(SCENARIOS).join(', ')}`);
  }
  return found;
}
