import { render } from '@testing-library/react';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type uPlot from 'uplot';
import { FakeUPlot } from '../../../testing/fake-uplot';
import type { ChartFrame } from './chart-options';
import { LevelInflowChart } from './level-inflow-chart';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const frame: ChartFrame = {
  windowEndS: 7200,
  windowS: 3600,
  levelRange: [204, 213],
  lines: [{ id: 'dam-crest', value: 212, label: 'Dam crest', color: '#ccc', crest: true }],
};

const props = {
  frame,
  timeZone: 'Europe/London',
  levelUnit: 'm',
  flowUnit: 'm³/s',
  description: 'test chart',
};

const data = (...xs: number[]): uPlot.AlignedData => [xs, xs.map(() => 207), xs.map(() => 800)];

describe('LevelInflowChart', () => {
  beforeEach(() => {
    FakeUPlot.instances.length = 0;
  });

  it('creates the chart once and feeds new data with setData', () => {
    const view = render(<LevelInflowChart {...props} data={data(3600)} />);
    view.rerender(<LevelInflowChart {...props} data={data(3600, 3660)} />);
    expect(FakeUPlot.instances).toHaveLength(1);
    const chart = FakeUPlot.instances[0];
    expect(chart?.setDataCalls.at(-1)?.[0]).toEqual([3600, 3660]);
  });

  it('sets the x range to the site-time window, whatever the data', () => {
    render(<LevelInflowChart {...props} data={data(3600)} />);
    const range = FakeUPlot.instances[0]?.opts.scales?.x?.range;
    expect(typeof range).toBe('function');
    const fn = range as (u: unknown, min: number, max: number, key: string) => unknown;
    expect(fn(null, 3600, 3600, 'x')).toEqual([3600, 7200]);
  });

  it('keeps every threshold in view on the level axis', () => {
    render(<LevelInflowChart {...props} data={data(3600)} />);
    const range = FakeUPlot.instances[0]?.opts.scales?.level?.range as (
      u: unknown,
      min: number,
      max: number,
      key: string,
    ) => unknown;
    expect(range(null, 206.9, 207.1, 'level')).toEqual([204, 213]);
    expect(range(null, 203.2, 207.1, 'level')).toEqual([203.2, 213]);
  });

  it('rebuilds for other units and destroys the chart it replaces and on unmount', () => {
    const view = render(<LevelInflowChart {...props} data={data(3600)} />);
    view.rerender(<LevelInflowChart {...props} levelUnit="ft" flowUnit="cfs" data={data(3600)} />);
    expect(FakeUPlot.instances).toHaveLength(2);
    expect(FakeUPlot.instances[0]?.destroyed).toBe(true);
    expect(FakeUPlot.instances[1]?.opts.axes?.[1]?.label).toBe('Pool elevation (ft)');
    view.unmount();
    expect(FakeUPlot.instances[1]?.destroyed).toBe(true);
  });
});
