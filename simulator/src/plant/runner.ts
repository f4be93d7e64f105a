import type { PlantClock } from './clock.js';
import type { PlantState, ReservoirPlant } from './reservoir-plant.js';

export interface RunnerOptions {
  plant: ReservoirPlant;
  clock: PlantClock;
  /** plant seconds per model step */
  stepS: number;
  /** called after every step, with the new state, to publish what is due */
  onStep: (state: Readonly<PlantState>) => void;
  /** false while the devices cannot take more messages (slow broker): the step waits */
  canStep?: () => boolean;
  /** longest stretch of one tick, wall ms, so the event loop stays responsive */
  budgetMs?: number;
  /** how far behind the clock may be, wall seconds, before it is re-anchored */
  maxLagS?: number;
  /** tick period, wall ms */
  tickMs?: number;
  /** called when the clock had to be re-anchored, with the plant seconds given up */
  onSlip?: (lostS: number) => void;
  now?: () => number;
}

/** Drives the plant in fixed plant-time steps, keeping up with the plant clock in real time. */
export class PlantRunner {
  private timer: NodeJS.Timeout | undefined;
  private readonly stepMs: number;
  private readonly now: () => number;

  constructor(private readonly options: RunnerOptions) {
    this.stepMs = options.stepS * 1000;
    this.now = options.now ?? Date.now;
  }

  /** Steps until plant time reaches `plantMs` (whole steps only); returns the number of steps. */
  advanceTo(plantMs: number, budgetMs = Infinity): number {
    const { plant, onStep, stepS, canStep } = this.options;
    const started = performance.now();
    let steps = 0;
    while (plant.state.timeMs + this.stepMs <= plantMs) {
      if (canStep && !canStep()) break;
      if (steps > 0 && performance.now() - started >= budgetMs) break;
      onStep(plant.step(stepS));
      steps++;
    }
    return steps;
  }

  start(): void {
    if (this.timer) return;
    this.timer = setInterval(() => this.tick(), this.options.tickMs ?? 50);
  }

  stop(): void {
    clearInterval(this.timer);
    this.timer = undefined;
  }

  /** One real-time tick: catch up as far as the budget allows; give up time that cannot be caught up. */
  tick(): void {
    const { clock, plant } = this.options;
    const wall = this.now();
    this.advanceTo(clock.nominalAt(wall), this.options.budgetMs ?? 20);
    const lagMs = clock.nominalAt(wall) - plant.state.timeMs;
    const maxLagMs = (this.options.maxLagS ?? 5) * 1000 * clock.speed;
    if (lagMs > maxLagMs) {
      clock.rebase(plant.state.timeMs, wall);
      this.options.onSlip?.(lagMs / 1000);
    }
  }
}
