import type { Scenario } from './scenario.js';

/**
 * The demo storm on Lake Orrin (invented). Light rain on the first day, then a burst of heavy rain
 * whose flood rises from hour 24 to about 1,900 m3/s at hour 30, four hours after the rain peaks.
 * From 204.5 m with the gates kept closed the pool overtops the dam crest (212 m, peak about
 * 213.1 m); with all gates opened fully at hour 12 the pool is drawn down first and peaks at about
 * 206.6 m, below the normal maximum (207 m). See docs/simulator.md.
 */
export const DEMO_STORM: Scenario = {
  id: 'demo-storm',
  name: 'Tamsel storm (demo)',
  description:
    'A 72-hour storm on Lake Orrin: inflow from 30 m3/s to about 1,900 m3/s near hour 30, rain leading by about 4 hours.',
  durationHours: 72,
  baseInflow: 30,
  inflowPulses: [
    // The forerunner's tail adds about 6 m3/s at hour 30, so the peak is about 1,900 m3/s.
    { startHour: 4, peakHour: 14, peak: 40, shape: 3 },
    { startHour: 24, peakHour: 30, peak: 1864, shape: 8 },
  ],
  rainPulses: [
    { startHour: 2, peakHour: 10, peak: 3, shape: 3 },
    { startHour: 21, peakHour: 26, peak: 32, shape: 6 },
  ],
  initial: {
    pool: 204.5,
    gates: { 'gate-1': 0, 'gate-2': 0, 'gate-3': 0 },
    valves: { 'low-level-outlet': 10 },
  },
  faults: [],
};
