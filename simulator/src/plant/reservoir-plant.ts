import { createStorageCurve, totalOutflow, type StorageCurve } from '@stillwell/shared/hydraulics';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { inflowAt, rainAt } from '../scenarios/hydrograph.js';
import type { Scenario } from '../scenarios/scenario.js';
import { DamInstruments, type InstrumentState } from './instruments.js';
import { tailwaterElevation } from './tailwater.js';

/** Something that can be set from a command: a gate (opening, m) or a valve (opening, %). */
export interface Actuator {
  id: string;
  kind: 'gate' | 'valve';
  /** the telemetry channel reporting its position */
  channel: string;
  max: number;
  /** largest change per second (m/s for gates, %/s for valves) */
  travelSpeed: number;
}

export interface Settings {
  gates: Record<string, number>;
  valves: Record<string, number>;
}

export interface PlantState {
  /** plant time, epoch ms */
  timeMs: number;
  /** m */
  pool: number;
  /** m3 */
  storage: number;
  /** m3/s */
  inflow: number;
  /** m3/s through all structures */
  outflow: number;
  /** mm/h */
  rain: number;
  /** m */
  tailwater: number;
  /**
   * true when storage is beyond the elevation-area-storage table: the pool is then reported at the
   * table's end (the model cannot say more), while storage keeps the water balance exact
   */
  beyondTable: boolean;
  /** actual positions, which lag the targets while the machinery travels */
  settings: Settings;
  /** seepage weirs, piezometers, and the scenario's hidden leak (m3/s, out of storage, unmeasured) */
  instruments: InstrumentState;
}

export interface PlantOptions {
  reservoir: ReservoirDefinition;
  scenario: Scenario;
  /** plant time at the start, epoch ms */
  startMs: number;
}

const copy = (s: Settings): Settings => ({ gates: { ...s.gates }, valves: { ...s.valves } });

function moveToward(current: number, target: number, maxDelta: number): number {
  if (Math.abs(target - current) <= maxDelta) return target;
  return current + Math.sign(target - current) * maxDelta;
}

/** The gates and valves a reservoir definition provides. */
export function actuatorsOf(reservoir: ReservoirDefinition): Actuator[] {
  const list: Actuator[] = [];
  for (const s of reservoir.structures) {
    if (s.kind === 'gated-spillway') {
      for (const g of s.gates) {
        list.push({
          id: g.id,
          kind: 'gate',
          channel: g.channel,
          max: g.maxOpening,
          travelSpeed: g.travelSpeed,
        });
      }
    } else if (s.kind === 'low-level-outlet') {
      list.push({
        id: s.id,
        kind: 'valve',
        channel: s.valveChannel,
        max: 100,
        travelSpeed: s.travelSpeed,
      });
    }
  }
  return list;
}

/**
 * Level-pool model of the reservoir: storage integrated from inflow minus outflow by Heun's method
 * (second order, so a 10 s step is far finer than the pool's response time of hours). Tailwater is
 * taken from the previous step's outflow, which avoids an implicit solve and lags by one step only.
 */
export class ReservoirPlant {
  readonly actuators: readonly Actuator[];
  private readonly curve: StorageCurve;
  private readonly startMs: number;
  private current: PlantState;
  private targets: Settings;
  private readonly instruments: DamInstruments;

  constructor(private readonly options: PlantOptions) {
    const { reservoir, scenario, startMs } = options;
    this.curve = createStorageCurve(reservoir.storageTable);
    this.actuators = actuatorsOf(reservoir);
    this.startMs = startMs;
    const settings: Settings = { gates: {}, valves: {} };
    for (const a of this.actuators) {
      const start =
        (a.kind === 'gate' ? scenario.initial.gates : scenario.initial.valves)[a.id] ?? 0;
      this.group(settings, a)[a.id] = Math.min(a.max, Math.max(0, start));
    }
    this.targets = copy(settings);
    const pool = scenario.initial.pool;
    this.instruments = new DamInstruments(reservoir, pool, scenario.leak);
    const outflow = this.outflowAt(
      pool,
      settings,
      tailwaterElevation(reservoir.riverbedElevation, 0),
    );
    this.current = {
      timeMs: startMs,
      pool,
      storage: this.curve.storageAt(pool),
      inflow: inflowAt(scenario, 0),
      outflow,
      rain: rainAt(scenario, 0),
      tailwater: tailwaterElevation(reservoir.riverbedElevation, outflow),
      beyondTable: false,
      settings,
      instruments: this.instruments.current,
    };
  }

  get state(): Readonly<PlantState> {
    return this.current;
  }

  /** Hours since the plant started (scenario time). */
  hourAt(timeMs: number): number {
    return (timeMs - this.startMs) / 3_600_000;
  }

  get targetSettings(): Settings {
    return copy(this.targets);
  }

  /**
   * Sets where gates and valves should go; they travel there at their own speed. Targets are
   * clamped to the range and unknown ids ignored: commands are checked before they get here.
   */
  setTargets(change: Partial<Settings>): void {
    for (const a of this.actuators) {
      const wanted = (a.kind === 'gate' ? change.gates : change.valves)?.[a.id];
      if (wanted !== undefined)
        this.group(this.targets, a)[a.id] = Math.min(a.max, Math.max(0, wanted));
    }
  }

  step(dtS: number): Readonly<PlantState> {
    const { reservoir, scenario } = this.options;
    const s0 = this.current;
    const t1 = s0.timeMs + dtS * 1000;
    const settings1: Settings = { gates: {}, valves: {} };
    for (const a of this.actuators) {
      const now = this.group(s0.settings, a)[a.id] ?? 0;
      const target = this.group(this.targets, a)[a.id] ?? now;
      this.group(settings1, a)[a.id] = moveToward(now, target, a.travelSpeed * dtS);
    }
    const inflow1 = inflowAt(scenario, this.hourAt(t1));
    // Heun: Euler predictor with the end-of-step gate positions, then the trapezoidal corrector.
    // A scenario's leak is one more (unmeasured) outflow.
    const leak0 = s0.instruments.leak;
    const predicted = s0.storage + dtS * (s0.inflow - s0.outflow - leak0);
    const poolPredicted = this.poolAt(predicted);
    const outPredicted = this.outflowAt(poolPredicted, settings1, s0.tailwater);
    const leakPredicted = this.instruments.leakAt(this.hourAt(t1), poolPredicted);
    const storage =
      s0.storage +
      (dtS * (s0.inflow + inflow1 - s0.outflow - outPredicted - leak0 - leakPredicted)) / 2;
    const pool = this.poolAt(storage);
    const outflow = this.outflowAt(pool, settings1, s0.tailwater);
    this.current = {
      timeMs: t1,
      pool,
      storage,
      inflow: inflow1,
      outflow,
      rain: rainAt(scenario, this.hourAt(t1)),
      tailwater: tailwaterElevation(reservoir.riverbedElevation, outflow),
      beyondTable: storage > this.curve.maxStorage || storage < this.curve.minStorage,
      settings: settings1,
      instruments: this.instruments.step(dtS, pool, this.hourAt(t1)),
    };
    return this.current;
  }

  private poolAt(storage: number): number {
    const { minStorage, maxStorage } = this.curve;
    return this.curve.elevationAt(Math.min(maxStorage, Math.max(minStorage, storage)));
  }

  private outflowAt(pool: number, settings: Settings, tailwater: number): number {
    return totalOutflow(this.options.reservoir.structures, pool, settings, tailwater);
  }

  private group(settings: Settings, a: Actuator): Record<string, number> {
    return a.kind === 'gate' ? settings.gates : settings.valves;
  }
}
