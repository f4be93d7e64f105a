import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { FlowPoint, OutletSettings } from '@stillwell/shared/hydraulics';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ChannelState, ReservoirStatus } from '@stillwell/shared/telemetry';
import { Reading } from '../telemetry/reading.entity';
import { StatusService } from '../telemetry/status.service';
import type { ForecastOptions } from './forecast-settings';
import { ForecastInputError, type ForecastState } from './live-forecast';
import type { CurrentView } from './material-change';

/** An operable control and the channel that reports its position. */
interface ControlChannel {
  id: string;
  kind: 'gate' | 'valve';
  channel: string;
}

export function controlChannels(def: ReservoirDefinition): ControlChannel[] {
  return def.structures.flatMap((s): ControlChannel[] => {
    if (s.kind === 'gated-spillway')
      return s.gates.map((g) => ({ id: g.id, kind: 'gate', channel: g.channel }));
    if (s.kind === 'low-level-outlet')
      return [{ id: s.id, kind: 'valve', channel: s.valveChannel }];
    return [];
  });
}

const usable = (c: ChannelState | undefined) => c !== undefined && c.quality === 'good' && !c.stale;

/** How far either side of the look-back time a pool reading may be to stand for it. */
const LOOKBACK_SLACK_MS = 15 * 60_000;

/**
 * Gathers what a forecast starts from: the status the overview shows (so the forecast and the
 * screen agree on the pool), the openings reported by the gate and valve channels, and the stored
 * inflow record.
 */
@Injectable()
export class ForecastInputsService {
  constructor(
    @InjectRepository(Reading) private readonly readings: Repository<Reading>,
    private readonly status: StatusService,
  ) {}

  /** The openings the telemetry reports; controls without a usable reading are listed apart. */
  currentOpenings(
    def: ReservoirDefinition,
    status: ReservoirStatus,
  ): { settings: OutletSettings; missing: string[] } {
    const settings: OutletSettings = { gates: {}, valves: {} };
    const missing: string[] = [];
    for (const c of controlChannels(def)) {
      const state = status.channels.find((s) => s.channel === c.channel);
      if (!usable(state)) missing.push(c.id);
      else if (c.kind === 'gate') settings.gates[c.id] = state!.value;
      else settings.valves[c.id] = state!.value;
    }
    return { settings, missing };
  }

  /** What the material-change rule compares with the last run. */
  currentView(def: ReservoirDefinition, reservoirId: string): CurrentView {
    const status = this.status.status(reservoirId);
    const openings: CurrentView['openings'] = {};
    for (const c of controlChannels(def)) {
      const state = status.channels.find((s) => s.channel === c.channel);
      if (usable(state)) openings[c.id] = { value: state!.value, kind: c.kind };
    }
    const pool = status.pool
      ? status.channels.find((c) => c.channel === status.pool!.source)
      : undefined;
    return {
      openings,
      inflow: status.inflow,
      pool: status.pool && pool ? { elevation: status.pool.elevation, tMs: pool.t } : null,
    };
  }

  async gather(def: ReservoirDefinition, o: ForecastOptions): Promise<ForecastState> {
    const status = this.status.status(def.id);
    const nowMs = status.clock.now;
    if (!status.pool)
      throw new ForecastInputError(
        'no usable pool reading: every pool gauge is stale, suspect or bad',
      );
    const notes: string[] = [];
    const { settings, missing } = this.currentOpenings(def, status);
    if (missing.length)
      notes.push(
        `no usable position reading for ${missing.join(', ')}: taken as closed, which errs towards a higher pool`,
      );
    const tailwaterDef = def.channels.find((c) => c.role === 'tailwater');
    const tw = tailwaterDef
      ? status.channels.find((c) => c.channel === tailwaterDef.id)
      : undefined;
    const inflowDef = def.channels.find((c) => c.role === 'inflow');
    if (!inflowDef) throw new ForecastInputError('the definition has no inflow channel');
    const inflowState = status.channels.find((c) => c.channel === inflowDef.id);
    if (inflowState?.stale)
      notes.push(
        `the inflow gauge has been silent for ${Math.round(inflowState.ageS / 60)} min: the forecast starts from its last good reading`,
      );
    const observedInflow = await this.inflowRecord(
      def.id,
      inflowDef.id,
      nowMs - o.inflow.recessionWindowS * 1000,
      nowMs,
    );
    return {
      nowMs,
      pool: { elevation: status.pool.elevation, source: status.pool.source },
      openings: settings,
      assumedClosed: missing,
      tailwater: usable(tw) ? tw!.value : null,
      observedInflow,
      lookback:
        o.lookbackS > 0
          ? await this.lookback(def, status.pool.source, nowMs - o.lookbackS * 1000)
          : null,
      notes,
    };
  }

  /** Good inflow readings in [from, to], one per time, as flow points in epoch seconds. */
  private async inflowRecord(
    reservoirId: string,
    channel: string,
    from: number,
    to: number,
  ): Promise<FlowPoint[]> {
    const rows = await this.readings
      .createQueryBuilder('r')
      .select(['r.time', 'r.value'])
      .where('r.reservoir_id = :reservoirId AND r.channel = :channel', { reservoirId, channel })
      .andWhere("r.quality = 'good' AND r.time BETWEEN :from AND :to", { from, to })
      .orderBy('r.time', 'ASC')
      .getMany();
    const points: FlowPoint[] = [];
    for (const r of rows) {
      const t = r.time / 1000;
      // a repeated time (two deliveries of one measurement) keeps the later row
      if (points.length && points[points.length - 1]!.t === t)
        points[points.length - 1]!.q = r.value;
      else points.push({ t, q: r.value });
    }
    return points;
  }

  /** The pool and openings last reported at or before `atMs`, if a pool reading is close enough. */
  private async lookback(
    def: ReservoirDefinition,
    poolChannel: string,
    atMs: number,
  ): Promise<ForecastState['lookback']> {
    const pool = await this.lastBefore(def.id, poolChannel, atMs);
    if (!pool || atMs - pool.time > LOOKBACK_SLACK_MS) return null;
    const openings: OutletSettings = { gates: {}, valves: {} };
    for (const c of controlChannels(def)) {
      const r = await this.lastBefore(def.id, c.channel, pool.time);
      if (!r) continue;
      if (c.kind === 'gate') openings.gates[c.id] = r.value;
      else openings.valves[c.id] = r.value;
    }
    return { atMs: pool.time, elevation: pool.value, openings };
  }

  private lastBefore(reservoirId: string, channel: string, atMs: number) {
    return this.readings
      .createQueryBuilder('r')
      .select(['r.time', 'r.value'])
      .where('r.reservoir_id = :reservoirId AND r.channel = :channel', { reservoirId, channel })
      .andWhere("r.quality = 'good' AND r.time <= :atMs", { atMs })
      .orderBy('r.time', 'DESC')
      .limit(1)
      .getOne();
  }
}
