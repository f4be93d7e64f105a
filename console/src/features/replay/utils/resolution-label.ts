import type { ReplayResolution } from '@stillwell/shared/replay';

const LABELS: Record<ReplayResolution, string> = {
  raw: 'Raw readings',
  minute: 'One-minute aggregates',
  hour: 'Hourly roll-ups',
};

/** What the chart is drawn from, in words, for the playback panel's caption. */
export const resolutionLabel = (r: ReplayResolution): string => LABELS[r];
