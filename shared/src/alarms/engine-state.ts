import { createStorageCurve, type StorageCurve } from '../hydraulics/storage-curve.js';
import type { ChannelDefinition, ReservoirDefinition } from '../reservoirs/definition.js';
import type { Quality } from '../telemetry/message.js';
import type { Verdict } from './detector.js';
import type { AlarmSettings } from './settings.js';
import { TimeSeries } from './series.js';

/** A reading as the engine takes it: the channel's SI value at its measurement time (site ms). */
export interface EngineReading {
  channel: string;
  t: number;
  v: number;
  q: Quality;
}

/**
 * What the alarm conditions read from a forecast run: a structural subset of the forecast
 * module's ForecastRun (@stillwell/shared/forecasts), so either can be passed.
 */
export interface ForecastOutlook {
  /** site time of the run, epoch ms */
  computedAtMs: number;
  peak: { elevation: number };
  thresholds: ReadonlyArray<{
    id: string;
    elevation: number;
    /** first crossing in the run, null when the pool does not reach the level */
    timeMs: number | null;
    alreadyAbove: boolean;
  }>;
  timeLeft: {
    status: 'ok' | 'past' | 'impossible' | 'not-needed';
    timeLeftS: number | null;
  };
}

/** One condition judged once: the verdict and what to tell the operator about it. */
export interface Judgement {
  id: string;
  verdict: Verdict;
  value: number | null;
  limit: number | null;
  message: string;
}

/** First-order lag of the pool, the way seepage and pore pressure follow it. */
export class LagFilter {
  value: number | null = null;
  private lastT = 0;
  private startT = 0;

  constructor(readonly tauMs: number) {}

  update(t: number, v: number): void {
    if (this.value === null) {
      this.value = v;
      this.lastT = this.startT = t;
      return;
    }
    if (t <= this.lastT) return;
    const a = this.tauMs > 0 ? 1 - Math.exp(-(t - this.lastT) / this.tauMs) : 1;
    this.value += (v - this.value) * a;
    this.lastT = t;
  }

  /** Started from one reading, the filter needs about two time constants to forget where it began. */
  warm(nowMs: number): boolean {
    return this.value !== null && nowMs - this.startT >= 2 * this.tauMs;
  }
}

interface FrozenTrack {
  ref: number;
  since: number;
  lastT: number;
}

/** How much history the conditions look back over, beyond their own windows. */
const MARGIN_MS = 30 * 60_000;

/** Everything the evaluators read: recent readings, rejections, filters and the latest forecast. */
export class EngineState {
  readonly channels: ReadonlyMap<string, ChannelDefinition>;
  readonly good = new Map<string, TimeSeries>();
  readonly last = new Map<string, { t: number; v: number; q: Quality }>();
  readonly rejects = new Map<string, number[]>();
  readonly frozen = new Map<string, FrozenTrack>();
  readonly lags = new Map<string, LagFilter>();
  readonly curve: StorageCurve;
  forecast: ForecastOutlook | null = null;
  /** a channel never heard from counts as silent from here (the start, or a later hold) */
  silenceFromMs: number;
  /** site time the feed was last known to be delivering (the gateway says so; see noteFeedAlive) */
  feedAliveAt = -Infinity;
  private readonly frozenBands: ReadonlyMap<string, number>;

  constructor(
    readonly def: ReservoirDefinition,
    readonly settings: AlarmSettings,
    /** site time the engine started: a channel never heard from counts as silent from here */
    readonly startedMs: number,
  ) {
    this.silenceFromMs = startedMs;
    this.channels = new Map(def.channels.map((c) => [c.id, c]));
    this.curve = createStorageCurve(def.storageTable, { outOfRange: 'clamp' });
    const keepMs =
      Math.max(
        settings.massBalance.windowS +
          settings.massBalance.endAverageS +
          settings.massBalance.maxGapS,
        settings.rateOfRise.windowS,
        settings.rateOfRise.firstFilling.windowS,
        settings.gaugeDisagreement.windowS,
      ) *
        1000 +
      MARGIN_MS;
    for (const c of def.channels) this.good.set(c.id, new TimeSeries(keepMs));
    this.frozenBands = new Map(settings.frozen.map((f) => [f.channel, f.band]));
    for (const x of [...(def.seepageWeirs ?? []), ...(def.piezometers ?? [])]) {
      this.lags.set(x.id, new LagFilter(x.baseline.lagHours * 3_600_000));
    }
  }

  ingest(r: EngineReading): void {
    const def = this.channels.get(r.channel);
    if (!def) return;
    const held = this.last.get(r.channel);
    if (held && held.t >= r.t) return;
    this.last.set(r.channel, { t: r.t, v: r.v, q: r.q });
    if (r.q !== 'good') return;
    this.good.get(r.channel)!.push(r.t, r.v);
    this.trackFrozen(r);
    if (def.role === 'pool' && this.preferredPoolAt(r.t) === r.channel) {
      for (const f of this.lags.values()) f.update(r.t, r.v);
    }
  }

  reject(channel: string, timeMs: number): void {
    const list = this.rejects.get(channel) ?? [];
    list.push(timeMs);
    const keep =
      Math.max(this.settings.outOfRange.windowS, this.settings.outOfRange.clearAfterS) * 1000;
    while (list.length && list[0]! < timeMs - keep) list.shift();
    this.rejects.set(channel, list);
  }

  /** The channel's latest reading is good and younger than its stale limit. */
  fresh(channel: string, nowMs: number): boolean {
    const c = this.channels.get(channel);
    const r = this.last.get(channel);
    return !!c && !!r && r.q === 'good' && nowMs - r.t <= c.staleAfterS * 1000;
  }

  /** Site time since the channel was last heard from (its stale age), ms. */
  silentFor(channel: string, nowMs: number): number {
    return nowMs - (this.last.get(channel)?.t ?? this.silenceFromMs);
  }

  /** The newest measurement time of any channel, null before the first. */
  newest(): number | null {
    let t: number | null = null;
    for (const r of this.last.values()) if (t === null || r.t > t) t = r.t;
    return t;
  }

  /** The pool as the status shows it: the first good, fresh gauge in the definition's order. */
  pool(nowMs: number): { channel: string; value: number } | null {
    for (const id of this.def.poolChannels) {
      if (this.fresh(id, nowMs)) return { channel: id, value: this.last.get(id)!.v };
    }
    return null;
  }

  private preferredPoolAt(t: number): string | null {
    for (const id of this.def.poolChannels) {
      const latest = this.good.get(id)?.latest();
      const c = this.channels.get(id)!;
      if (latest && t - latest.t <= c.staleAfterS * 1000) return id;
    }
    return null;
  }

  private trackFrozen(r: EngineReading): void {
    const band = this.frozenBands.get(r.channel);
    if (band === undefined) return;
    const track = this.frozen.get(r.channel);
    const staleMs = this.channels.get(r.channel)!.staleAfterS * 1000;
    // a silence is not stillness: after a gap the channel has to prove itself stuck afresh
    if (!track || Math.abs(r.v - track.ref) > band || r.t - track.lastT > staleMs) {
      this.frozen.set(r.channel, { ref: r.v, since: r.t, lastT: r.t });
    } else {
      track.lastT = r.t;
    }
  }
}

export type Evaluator = (state: EngineState, nowMs: number) => Judgement[];
