import type { ReservoirDefinition } from '../reservoirs/definition.js';
import { buildConditions, type AlarmCondition } from './conditions.js';
import { Debouncer, type Transition } from './detector.js';
import {
  EngineState,
  type EngineReading,
  type Evaluator,
  type ForecastOutlook,
  type Judgement,
} from './engine-state.js';
import { evaluateFrozen, evaluateOutOfRange, evaluateSilence } from './evaluate-data.js';
import { evaluatePiezometers, evaluateSeepage } from './evaluate-dam-safety.js';
import { evaluateForecast, MassBalanceEvaluator } from './evaluate-forecast.js';
import {
  evaluateGaugeDisagreement,
  evaluatePoolLevels,
  evaluateRateOfRise,
} from './evaluate-pool.js';
import { alarmSettingsOf, type AlarmSettings } from './settings.js';

/** A condition raised or cleared, with what the operator should be told. */
export interface ConditionChange {
  conditionId: string;
  change: Transition;
  /** site time, epoch ms */
  timeMs: number;
  value: number | null;
  limit: number | null;
  message: string;
}

/** The present verdict of a condition, for screens that show why an alarm is (not) active. */
export interface ConditionReading {
  conditionId: string;
  active: boolean;
  value: number | null;
  limit: number | null;
  message: string;
}

export interface AlarmEngineOptions {
  /** site time the engine starts, epoch ms */
  startMs: number;
  /** condition ids whose alarms were active when the engine last stopped */
  active?: Iterable<string>;
}

/**
 * Judges every alarm condition of a reservoir from its readings, its quarantine and its forecast,
 * in site time, and reports raises and clears. Pure and synchronous: the gateway feeds it the
 * stored batches and its clock; a test feeds it a simulated plant. Alarm handling (acknowledge,
 * shelve, ...) is not its business: see lifecycle.ts.
 */
export class AlarmEngine {
  readonly conditions: readonly AlarmCondition[];
  readonly settings: AlarmSettings;
  private readonly byId: ReadonlyMap<string, AlarmCondition>;
  private readonly state: EngineState;
  private readonly debouncers = new Map<string, Debouncer>();
  private readonly latest = new Map<string, Judgement>();
  private readonly massBalance = new MassBalanceEvaluator();
  private readonly evaluators: readonly Evaluator[];

  constructor(
    readonly definition: ReservoirDefinition,
    options: AlarmEngineOptions,
  ) {
    this.settings = alarmSettingsOf(definition);
    this.conditions = buildConditions(definition, this.settings);
    this.byId = new Map(this.conditions.map((c) => [c.id, c]));
    this.state = new EngineState(definition, this.settings, options.startMs);
    const active = new Set(options.active ?? []);
    for (const c of this.conditions) {
      this.debouncers.set(
        c.id,
        new Debouncer(c.onDelayS * 1000, active.has(c.id), c.offDelayS * 1000),
      );
    }
    this.evaluators = [
      evaluatePoolLevels,
      evaluateRateOfRise,
      evaluateForecast,
      evaluateGaugeDisagreement,
      evaluateSeepage,
      evaluatePiezometers,
      (s, now) => this.massBalance.evaluate(s, now),
      evaluateSilence,
      evaluateFrozen,
      evaluateOutOfRange,
    ];
  }

  condition(id: string): AlarmCondition | undefined {
    return this.byId.get(id);
  }

  isActive(id: string): boolean {
    return this.debouncers.get(id)?.active ?? false;
  }

  ingest(readings: readonly EngineReading[]): void {
    for (const r of readings) this.state.ingest(r);
  }

  /** A message quarantined as out of range for a channel (site time of the measurement). */
  noteOutOfRange(channel: string, timeMs: number): void {
    if (this.state.channels.has(channel)) this.state.reject(channel, timeMs);
  }

  /**
   * Channels never heard from are not yet silent at `nowMs`: the gateway holds their silence while
   * the feed is still connecting (a site clock running 600 times faster than the wall would
   * otherwise call a feed silent before its first message could arrive).
   */
  holdSilence(nowMs: number): void {
    this.state.silenceFromMs = Math.max(this.state.silenceFromMs, nowMs);
  }

  /**
   * The feed is delivering as of `nowMs` even if its newest reading is older: the gateway says so
   * while batches keep arriving in wall time, so a processing stall is not taken for silence.
   */
  noteFeedAlive(nowMs: number): void {
    this.state.feedAliveAt = Math.max(this.state.feedAliveAt, nowMs);
  }

  acceptForecast(outlook: ForecastOutlook | null): void {
    this.state.forecast = outlook;
  }

  /** The last water balance computed (for the dam-safety and alarm screens), null before one. */
  get lastMassBalance() {
    return this.massBalance.latest;
  }

  /** Judges every telemetry and forecast condition at `nowMs`; returns what changed. */
  evaluate(nowMs: number): ConditionChange[] {
    const changes: ConditionChange[] = [];
    for (const evaluate of this.evaluators) {
      for (const j of evaluate(this.state, nowMs)) {
        const d = this.debouncers.get(j.id);
        if (!d) continue;
        this.latest.set(j.id, j);
        const change = d.update(j.verdict, nowMs);
        if (change)
          changes.push({
            conditionId: j.id,
            change,
            timeMs: nowMs,
            value: j.value,
            limit: j.limit,
            message: j.message,
          });
      }
    }
    return changes;
  }

  /**
   * A condition judged elsewhere (gate position against its command, from the gate-orders
   * module): raised or cleared at once. Null when it was already so; throws for an id that is
   * not an external condition of this reservoir.
   */
  setExternal(
    conditionId: string,
    active: boolean,
    timeMs: number,
    details: { message: string; value?: number | null; limit?: number | null },
  ): ConditionChange | null {
    const c = this.byId.get(conditionId);
    if (!c || c.source !== 'external') {
      throw new RangeError(
        `"${conditionId}" is not an external alarm condition of ${this.definition.id}`,
      );
    }
    const d = this.debouncers.get(conditionId)!;
    if (d.active === active) return null;
    d.force(active);
    this.latest.set(conditionId, {
      id: conditionId,
      verdict: active ? 'set' : 'reset',
      value: details.value ?? null,
      limit: details.limit ?? null,
      message: details.message,
    });
    return {
      conditionId,
      change: active ? 'raise' : 'clear',
      timeMs,
      value: details.value ?? null,
      limit: details.limit ?? null,
      message: details.message,
    };
  }

  /** Every condition's present verdict, in the catalog's order. */
  readings(): ConditionReading[] {
    return this.conditions.map((c) => {
      const j = this.latest.get(c.id);
      return {
        conditionId: c.id,
        active: this.isActive(c.id),
        value: j?.value ?? null,
        limit: j?.limit ?? c.limit,
        message: j?.message ?? 'not judged yet',
      };
    });
  }
}
