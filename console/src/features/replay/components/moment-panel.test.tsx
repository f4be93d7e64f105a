import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { REPLAY_FORECAST_CAUTION, type ReplayForecast } from '@stillwell/shared/replay';
import { MomentPanel } from './moment-panel';

const T = Date.UTC(2026, 11, 3, 10, 40);

const forecast: ReplayForecast = {
  id: 7,
  computedAtMs: T,
  trigger: 'scheduled',
  startMs: T,
  stepS: 900,
  elevation: [206.5, 206.99],
  p10: [206.4, 206.8],
  p50: [206.5, 206.99],
  p90: [206.6, 207.19],
  peak: { elevation: 206.99, timeMs: T + 900_000, p90: 207.19 },
  timeLeftStatus: 'not-needed',
  latestStartMs: null,
  caution: REPLAY_FORECAST_CAUTION,
};

const series = [
  {
    channel: 'pool.radar',
    label: 'Pool (radar)',
    role: 'pool' as const,
    unit: 'm' as const,
    t: [T - 60_000, T + 60_000],
    v: [205.89, 205.95],
    q: ['good' as const, 'good' as const],
    sourcePoints: 2,
  },
];

describe('MomentPanel', () => {
  it('gives the stored forecast peak with its unit, in the chosen unit system', () => {
    const { unmount } = render(
      <MomentPanel
        cursorMs={T}
        series={series}
        alarms={[]}
        forecast={forecast}
        system="si"
        timeZone="UTC"
      />,
    );
    expect(screen.getByTestId('replay-forecast').textContent).toMatch(
      /peak 206\.99 m \(p90 207\.19 m\)/,
    );
    expect(screen.getByTestId('replay-value-pool.radar').textContent).toBe('205.89 m');
    unmount();
    render(
      <MomentPanel
        cursorMs={T}
        series={series}
        alarms={[]}
        forecast={forecast}
        system="us"
        timeZone="UTC"
      />,
    );
    expect(screen.getByTestId('replay-forecast').textContent).toMatch(/peak 679\.\d+ ft/);
  });

  it('says so when no run had been made by the moment', () => {
    render(
      <MomentPanel
        cursorMs={T}
        series={[]}
        alarms={[]}
        forecast={null}
        system="si"
        timeZone="UTC"
      />,
    );
    expect(screen.getByTestId('replay-forecast').textContent).toMatch(/No forecast run/);
  });
});
