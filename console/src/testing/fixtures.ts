import { DEMO_RESERVOIR, type ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type {
  ChannelState,
  Quality,
  Reading,
  ReadingSeries,
  ReservoirStatus,
} from '@stillwell/shared/telemetry';

/** The demo reservoir is test data only here. */
export const definition: ReservoirDefinition = DEMO_RESERVOIR;

/** A fixed site time: 2026-03-03 14:00:00 UTC (GMT in Europe/London). */
export const SITE_NOW = Date.UTC(2026, 2, 3, 14, 0, 0);

export function channelState(
  channel: string,
  value: number,
  overrides: Partial<ChannelState> = {},
): ChannelState {
  const def = definition.channels.find((c) => c.id === channel);
  if (!def) throw new Error(`no channel ${channel} in the fixture`);
  return {
    channel,
    deviceId: def.deviceId,
    value,
    unit: def.unit,
    quality: 'good',
    seq: 1,
    t: SITE_NOW - 30_000,
    ageS: 30,
    stale: false,
    ...overrides,
  };
}

export function makeStatus(overrides: Partial<ReservoirStatus> = {}): ReservoirStatus {
  return {
    reservoirId: definition.id,
    clock: { now: SITE_NOW, speed: 360, simulated: true },
    pool: { elevation: 207, source: 'pool.radar', freeboard: 5, rateOfRise: 0.125 },
    inflow: 850,
    outflow: 420,
    channels: [
      channelState('pool.radar', 207),
      channelState('pool.pressure', 206.98),
      channelState('inflow', 850),
      channelState('outflow', 420),
      channelState('rain', 12.5, { ageS: 2400, stale: true, t: SITE_NOW - 2_400_000 }),
      channelState('tailwater', 176.4, { quality: 'bad' }),
    ],
    ingestion: { stored: 12345, quarantined: 0, gaps: 0 },
    ...overrides,
  };
}

export function makeSeries(
  channel: string,
  points: ReadonlyArray<readonly [t: number, v: number, q?: Quality]>,
): ReadingSeries {
  const def = definition.channels.find((c) => c.id === channel);
  return {
    channel,
    unit: def?.unit ?? 'm',
    t: points.map(([t]) => t),
    v: points.map(([, v]) => v),
    q: points.map(([, , q]) => q ?? 'good'),
  };
}

export function makeReading(channel: string, t: number, v: number, q: Quality = 'good'): Reading {
  const def = definition.channels.find((c) => c.id === channel);
  return {
    reservoirId: definition.id,
    deviceId: def?.deviceId ?? 'unknown',
    channel,
    seq: Math.round(t / 1000),
    t,
    v,
    q,
  };
}
