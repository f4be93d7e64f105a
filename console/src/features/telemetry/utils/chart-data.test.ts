import { describe, expect, it } from 'vitest';
import { toDisplay } from '@stillwell/shared/units';
import { makeSeries } from '../../../testing/fixtures';
import { toAlignedData } from './chart-data';

const same = (v: number) => v;

describe('toAlignedData', () => {
  it('gives x in seconds, ascending and unique, across both series', () => {
    const pool = makeSeries('pool.radar', [
      [3_000, 207.1],
      [1_000, 207.0],
      [2_000, 207.05],
    ]);
    const inflow = makeSeries('inflow', [
      [2_000, 800],
      [4_500, 810],
    ]);
    const [xs, poolYs, inflowYs] = toAlignedData([
      { series: pool, toDisplay: same },
      { series: inflow, toDisplay: same },
    ]);
    expect(Array.from(xs)).toEqual([1, 2, 3, 4.5]);
    expect(poolYs).toEqual([207.0, 207.05, 207.1, undefined]);
    expect(inflowYs).toEqual([undefined, 800, undefined, 810]);
  });

  it('keeps the later of two points at the same time', () => {
    const pool = makeSeries('pool.radar', [
      [1_000, 207.0],
      [1_000, 207.2],
    ]);
    const [xs, ys] = toAlignedData([{ series: pool, toDisplay: same }]);
    expect(Array.from(xs)).toEqual([1]);
    expect(ys).toEqual([207.2]);
  });

  it('turns a bad reading into a gap (null), never a drawn value', () => {
    const pool = makeSeries('pool.radar', [
      [1_000, 207.0],
      [2_000, 150.0, 'bad'],
      [3_000, 207.1, 'suspect'],
    ]);
    const [, ys] = toAlignedData([{ series: pool, toDisplay: same }]);
    expect(ys).toEqual([207.0, null, 207.1]);
  });

  it('converts values for display', () => {
    const pool = makeSeries('pool.radar', [[1_000, 207]]);
    const [, ys] = toAlignedData([
      { series: pool, toDisplay: (v) => toDisplay(v, 'length', 'us').value },
    ]);
    expect(ys?.[0]).toBeCloseTo(679.1339, 3);
  });

  it('copes with a series not loaded yet', () => {
    const inflow = makeSeries('inflow', [[1_000, 800]]);
    const [xs, poolYs, inflowYs] = toAlignedData([
      { series: undefined, toDisplay: same },
      { series: inflow, toDisplay: same },
    ]);
    expect(Array.from(xs)).toEqual([1]);
    expect(poolYs).toEqual([undefined]);
    expect(inflowYs).toEqual([800]);
  });
});
