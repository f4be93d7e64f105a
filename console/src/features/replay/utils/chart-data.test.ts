import { describe, expect, it } from 'vitest';
import type { ReplayForecast, ReplaySeries } from '@stillwell/shared/replay';
import { buildChartData } from './chart-data';

const series = (channel: string, role: ReplaySeries['role'], t: number[], v: number[]) =>
  ({
    channel,
    label: channel,
    role,
    unit: role === 'pool' ? 'm' : 'm3/s',
    t,
    v,
    q: t.map(() => 'good'),
    sourcePoints: t.length,
  }) as ReplaySeries;

describe('buildChartData', () => {
  it('aligns series on the union of their times, null where one has no point', () => {
    const { specs, data } = buildChartData(
      [
        series('pool.radar', 'pool', [0, 2000], [204, 205]),
        series('inflow', 'inflow', [1000, 2000], [30, 40]),
        series('rain', 'rain', [0], [1]),
      ],
      null,
      (v) => v,
    );
    expect(specs.map((s) => [s.key, s.scale])).toEqual([
      ['pool.radar', 'level'],
      ['inflow', 'flow'],
    ]);
    expect(data).toEqual([
      [0, 1, 2],
      [204, null, 205],
      [null, 30, 40],
    ]);
  });

  it('adds the forecast band on its own times, converted for display', () => {
    const forecast = {
      startMs: 3000,
      stepS: 1,
      elevation: [1, 2],
      p10: [1, 1],
      p50: [2, 2],
      p90: [3, 4],
    } as ReplayForecast;
    const { specs, data } = buildChartData(
      [series('pool.radar', 'pool', [0], [204])],
      forecast,
      (v) => v * 10,
    );
    expect(specs.map((s) => s.kind)).toEqual(['observed', 'band-low', 'band-mid', 'band-high']);
    expect(data[0]).toEqual([0, 3, 4]);
    expect(data[4]).toEqual([null, 30, 40]);
  });
});
