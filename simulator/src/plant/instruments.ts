import type { ReservoirDefinition, SeepageWeir } from '@stillwell/shared/reservoirs';
import { leakFlow, type Leak } from '../scenarios/leak.js';

/**
 * The dam as its seepage weirs and foundation piezometers see it. Each responds to the pool with a
 * first-order lag. The "true" dam differs a little from the baselines in the definition (a fitted
 * model is never the dam itself): flows 4 % higher, exponents 3 % lower, lags 10 % longer. Noise is
 * the instruments' business (devices/channels.ts).
 */
export interface InstrumentState {
  /** seepage reaching each weir, m3/s, by weir id */
  seepage: Record<string, number>;
  /** piezometric level, m, by piezometer id */
  piezometers: Record<string, number>;
  /** the leak's flow out of the reservoir, m3/s (0 without one) */
  leak: number;
}

const TRUTH = { flow: 1.04, exponent: 0.97, lag: 1.1 } as const;

interface Lagged {
  id: string;
  tauS: number;
  /** the level or flow this one tends to at a pool (and tailwater) */
  target: (pool: number) => number;
  value: number;
}

function steadySeepage(w: SeepageWeir, pool: number): number {
  const b = w.baseline;
  const x = (pool - b.zeroFlowPool) / (b.referencePool - b.zeroFlowPool);
  return x > 0 ? TRUTH.flow * b.referenceFlow * x ** (b.exponent * TRUTH.exponent) : 0;
}

export class DamInstruments {
  private readonly weirs: Lagged[];
  private readonly piezometers: Lagged[];
  private readonly weirOfLeak: string | null;
  /** the leak's exit: the lowest weir baseline's zero-flow pool, and the head at its reference */
  private readonly leakExit: number;
  private readonly leakReferenceHead: number;
  current: InstrumentState;

  constructor(
    reservoir: ReservoirDefinition,
    pool: number,
    private readonly leak: Leak | undefined,
  ) {
    const weirs = reservoir.seepageWeirs ?? [];
    this.weirs = weirs.map((w) => ({
      id: w.id,
      tauS: w.baseline.lagHours * 3600 * TRUTH.lag,
      target: (p) => steadySeepage(w, p),
      value: steadySeepage(w, pool),
    }));
    this.piezometers = (reservoir.piezometers ?? []).map((p) => {
      const b = p.baseline;
      const target = (z: number) => b.downstreamLevel + b.ratio * (z - b.downstreamLevel);
      return { id: p.id, tauS: b.lagHours * 3600 * TRUTH.lag, target, value: target(pool) };
    });
    const leakWeir = leak ? weirs.find((w) => w.abutment === leak.abutment) : undefined;
    this.weirOfLeak = leakWeir?.id ?? null;
    this.leakExit = leakWeir?.baseline.zeroFlowPool ?? reservoir.riverbedElevation;
    this.leakReferenceHead = reservoir.normalMaxPool - this.leakExit;
    this.current = this.snapshot(0);
  }

  /** The leak's flow now, m3/s, for the water balance of the plant. */
  leakAt(hour: number, pool: number): number {
    return this.leak ? leakFlow(this.leak, hour, pool - this.leakExit, this.leakReferenceHead) : 0;
  }

  step(dtS: number, pool: number, hour: number): InstrumentState {
    for (const x of [...this.weirs, ...this.piezometers]) {
      const a = x.tauS > 0 ? 1 - Math.exp(-dtS / x.tauS) : 1;
      x.value += (x.target(pool) - x.value) * a;
    }
    this.current = this.snapshot(this.leakAt(hour, pool));
    return this.current;
  }

  private snapshot(leak: number): InstrumentState {
    const seepage: Record<string, number> = {};
    for (const w of this.weirs) {
      // the part of a leak that surfaces at its abutment comes straight through, without the lag
      seepage[w.id] = w.value + (w.id === this.weirOfLeak ? leak * this.leak!.weirShare : 0);
    }
    const piezometers: Record<string, number> = {};
    for (const p of this.piezometers) piezometers[p.id] = p.value;
    return { seepage, piezometers, leak };
  }
}
