import type { Pulse, Scenario } from './scenario.js';

/**
 * Value of a pulse at `hour`: peak * x^k * e^(k(1-x)) with x the time since the start over the
 * time to peak. Smooth from zero, exactly `peak` at peakHour, with a long recession.
 */
export function pulseAt(pulse: Pulse, hour: number): number {
  if (hour <= pulse.startHour) return 0;
  const x = (hour - pulse.startHour) / (pulse.peakHour - pulse.startHour);
  return pulse.peak * Math.exp(pulse.shape * (Math.log(x) + 1 - x));
}

function sumAt(pulses: readonly Pulse[], hour: number): number {
  let total = 0;
  for (const p of pulses) total += pulseAt(p, hour);
  return total;
}

/** Inflow to the reservoir, m3/s; back at the base flow once the storm is over. */
export function inflowAt(scenario: Scenario, hour: number): number {
  if (hour >= scenario.durationHours) return scenario.baseInflow;
  return scenario.baseInflow + sumAt(scenario.inflowPulses, hour);
}

/** Rain intensity, mm/h; zero once the storm is over. */
export function rainAt(scenario: Scenario, hour: number): number {
  if (hour >= scenario.durationHours) return 0;
  return sumAt(scenario.rainPulses, hour);
}
