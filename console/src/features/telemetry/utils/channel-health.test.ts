import { describe, expect, it } from 'vitest';
import { channelState, definition, makeStatus } from '../../../testing/fixtures';
import { statusFreshness } from '../hooks/use-status-freshness';
import { describeChannels } from './channel-health';

describe('describeChannels', () => {
  it('follows the definition, marking channels without a reading as stale with no data', () => {
    const views = describeChannels(definition, makeStatus(), null);
    expect(views.map((v) => v.id)).toEqual(definition.channels.map((c) => c.id));
    const gate = views.find((v) => v.id === 'gate.1.opening');
    expect(gate).toMatchObject({ value: null, quality: null, ageS: null, stale: true });
    expect(views.find((v) => v.id === 'pool.radar')).toMatchObject({ stale: false, ageS: 30 });
    expect(views.find((v) => v.id === 'rain')?.stale).toBe(true);
  });

  it('keeps a channel the definition does not know, rather than hide its reading', () => {
    const status = makeStatus();
    status.channels.push({ ...channelState('inflow', 1), channel: 'spare.gauge' });
    const views = describeChannels(definition, status, null);
    expect(views.at(-1)).toMatchObject({ id: 'spare.gauge', label: 'spare.gauge', value: 1 });
  });

  it('marks everything stale, with grown ages, while the status is overdue', () => {
    const views = describeChannels(definition, makeStatus(), 3600);
    const pool = views.find((v) => v.id === 'pool.radar');
    expect(pool).toMatchObject({ stale: true, ageS: 3630 });
  });
});

describe('statusFreshness', () => {
  const status = makeStatus();

  it('is fresh while statuses keep coming', () => {
    expect(statusFreshness(status, 1_000, 3_000)).toEqual({ overdue: false, overdueSiteS: null });
  });

  it('is overdue after a quiet spell, estimating site seconds from the clock speed', () => {
    // 20 s of wall time at 360x is two site hours.
    expect(statusFreshness(status, 1_000, 21_000)).toEqual({ overdue: true, overdueSiteS: 7200 });
  });
});
