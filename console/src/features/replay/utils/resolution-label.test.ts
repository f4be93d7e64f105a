import { describe, expect, it } from 'vitest';
import { REPLAY_RESOLUTIONS } from '@stillwell/shared/replay';
import { resolutionLabel } from './resolution-label';

describe('resolutionLabel', () => {
  it('names every resolution the gateway may choose, each differently', () => {
    const labels = REPLAY_RESOLUTIONS.map(resolutionLabel);
    expect(labels).toEqual(['Raw readings', 'One-minute aggregates', 'Hourly roll-ups']);
    expect(new Set(labels).size).toBe(REPLAY_RESOLUTIONS.length);
  });
});
