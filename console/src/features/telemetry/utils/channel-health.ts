import type { ChannelRole, ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ChannelState, Quality, ReservoirStatus } from '@stillwell/shared/telemetry';
import type { Unit } from '@stillwell/shared/units';

/** One channel as the overview shows it. */
export interface ChannelView {
  id: string;
  label: string;
  role: ChannelRole | null;
  unit: Unit;
  /** null: no reading has come yet */
  value: number | null;
  quality: Quality | null;
  /** site seconds since the measurement */
  ageS: number | null;
  /** stale, or nothing known; a stale value is shown, but never as current */
  stale: boolean;
}

/**
 * The channels of the definition with their latest state, then any the status has that the
 * definition does not (so no reading drops out of view). While the status itself is overdue,
 * every channel is stale and its age grows by overdueSiteS.
 */
export function describeChannels(
  definition: ReservoirDefinition,
  status: ReservoirStatus,
  overdueSiteS: number | null,
): ChannelView[] {
  const states = new Map(status.channels.map((c) => [c.channel, c] as const));
  const view = (
    state: ChannelState | undefined,
    base: Pick<ChannelView, 'id' | 'label' | 'role' | 'unit'>,
  ): ChannelView => ({
    ...base,
    value: state?.value ?? null,
    quality: state?.quality ?? null,
    ageS: state ? state.ageS + (overdueSiteS ?? 0) : null,
    stale: !state || state.stale || overdueSiteS !== null,
  });

  const known = definition.channels.map((c) =>
    view(states.get(c.id), { id: c.id, label: c.label, role: c.role, unit: c.unit }),
  );
  const defined = new Set(definition.channels.map((c) => c.id));
  const extra = status.channels
    .filter((s) => !defined.has(s.channel))
    .map((s) => view(s, { id: s.channel, label: s.channel, role: null, unit: s.unit }));
  return [...known, ...extra];
}

/** What is in doubt about a value derived from a channel. */
export interface Doubt {
  stale: boolean;
  quality: Quality | null;
}

export function doubtOf(channel: ChannelView | undefined): Doubt {
  if (!channel) return { stale: true, quality: null };
  return { stale: channel.stale, quality: channel.quality };
}

export function isInDoubt(doubt: Doubt): boolean {
  return doubt.stale || doubt.quality !== 'good';
}

export function channelByRole(channels: readonly ChannelView[], role: ChannelRole) {
  return channels.find((c) => c.role === role);
}
