import { createPrng, type Prng } from '../../hydraulics/prng.js';
import { vNotchHead } from '../../hydraulics/v-notch.js';
import type { ChannelDefinition, ReservoirDefinition } from '../../reservoirs/definition.js';
import type { Quality } from '../../telemetry/message.js';
import { baselineFlow } from '../evaluate-dam-safety.js';
import type { AlarmEngine, ConditionChange } from '../engine.js';

/** A channel's true value at a site time; null: the instrument says nothing then. */
export type Signal = (tMs: number) => number | null;

export interface FakeSiteOptions {
  /** the pool elevation (both gauges read it, each with its noise) */
  pool?: (tMs: number) => number;
  /** true values of channels, replacing the steady ones */
  signals?: Record<string, Signal>;
  /** quality the instrument gives, by channel (default good) */
  quality?: Record<string, (tMs: number) => Quality>;
  /** when a channel ('*': every channel) says nothing at all */
  silent?: Record<string, (tMs: number) => boolean>;
  /** noise standard deviation by channel (a number or one by site time), replacing the role's */
  noise?: Record<string, number | ((tMs: number) => number)>;
  seed?: string;
}

const NOISE: Record<ChannelDefinition['role'], number> = {
  pool: 0.012,
  inflow: 0.9,
  outflow: 0.9,
  rain: 0,
  'gate-opening': 0,
  'valve-opening': 0,
  tailwater: 0.02,
  'seepage-weir-head': 0.0005,
  piezometer: 0.01,
};

/**
 * A reservoir at rest in site time, for the alarm tests: every channel reports at its interval with
 * the noise of a healthy instrument, at a steady pool with inflow equal to outflow; seepage and
 * piezometers on their baselines. Tests replace the signals they need and advance the clock: no
 * wall time is involved.
 */
export class FakeSite {
  readonly changes: ConditionChange[] = [];
  now: number;
  private readonly due = new Map<string, number>();
  private readonly rngs = new Map<string, Prng>();

  constructor(
    readonly engine: AlarmEngine,
    private readonly def: ReservoirDefinition,
    startMs: number,
    private readonly options: FakeSiteOptions = {},
  ) {
    this.now = startMs;
    for (const c of def.channels) {
      this.due.set(c.id, startMs);
      this.rngs.set(c.id, createPrng(`${options.seed ?? 'site'}/${c.id}`));
    }
  }

  /** Runs the site until `untilMs`, judging the alarms every `everyMs`; returns the new changes. */
  run(untilMs: number, everyMs = 30_000): ConditionChange[] {
    const first = this.changes.length;
    while (this.now < untilMs) {
      this.now = Math.min(untilMs, this.now + everyMs);
      const batch = [];
      for (const c of this.def.channels) {
        let due = this.due.get(c.id)!;
        while (due <= this.now) {
          const v = this.valueOf(c, due);
          if (v !== null) {
            const q = this.options.quality?.[c.id]?.(due) ?? 'good';
            batch.push({ channel: c.id, t: due, v, q });
          }
          due += c.intervalS * 1000;
        }
        this.due.set(c.id, due);
      }
      batch.sort((a, b) => a.t - b.t);
      this.engine.ingest(batch);
      this.changes.push(...this.engine.evaluate(this.now));
    }
    return this.changes.slice(first);
  }

  /** Changes of one condition so far. */
  of(conditionId: string): ConditionChange[] {
    return this.changes.filter((c) => c.conditionId === conditionId);
  }

  private valueOf(c: ChannelDefinition, t: number): number | null {
    const silent = this.options.silent;
    if (silent?.['*']?.(t) || silent?.[c.id]?.(t)) return null;
    const signal = this.options.signals?.[c.id];
    const truth = signal ? signal(t) : this.steady(c, t);
    if (truth === null) return null;
    const given = this.options.noise?.[c.id];
    const sigma = typeof given === 'function' ? given(t) : (given ?? NOISE[c.role]);
    const v = truth + (sigma > 0 ? sigma * this.rngs.get(c.id)!.normal() : 0);
    return Math.min(c.max, Math.max(c.min, v));
  }

  private steady(c: ChannelDefinition, t: number): number {
    const pool = this.options.pool?.(t) ?? 204.5;
    switch (c.role) {
      case 'pool':
        return pool;
      case 'inflow':
      case 'outflow':
        return 30;
      case 'tailwater':
        return 174.6;
      case 'seepage-weir-head': {
        const w = this.def.seepageWeirs?.find((x) => x.channel === c.id);
        return w ? vNotchHead(baselineFlow(w, pool)) : 0.1;
      }
      case 'piezometer': {
        const p = this.def.piezometers?.find((x) => x.channel === c.id);
        if (!p) return 190;
        const b = p.baseline;
        return b.downstreamLevel + b.ratio * (pool - b.downstreamLevel);
      }
      default:
        return 0;
    }
  }
}

export const HOUR_MS = 3_600_000;
export const MINUTE_MS = 60_000;
