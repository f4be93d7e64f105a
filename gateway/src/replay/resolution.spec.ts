import { chooseResolution } from './resolution';

const H = 3_600_000;

describe('chooseResolution', () => {
  const base = {
    fromMs: 100 * H,
    intervalsS: [30, 60, 60],
    rawMaxRows: 1000,
    minuteMaxRows: 3000,
    prunedThroughMs: 0,
  };

  it('reads raw readings while the window holds few enough', () => {
    // 30 s + 60 s + 60 s channels: 240 readings an hour
    const c = chooseResolution({ ...base, toMs: 104 * H });
    expect(c).toMatchObject({ resolution: 'raw', expectedRows: 960 });
  });

  it('switches to minute aggregates past the raw budget, to hours past the minute budget', () => {
    const c = chooseResolution({ ...base, toMs: 105 * H });
    expect(c.resolution).toBe('minute');
    expect(c.reason).toMatch(/1,200 readings, more than 1,000/);
    // 17 h x 60 min x 3 channels = 3,060 minute rows
    const h = chooseResolution({ ...base, toMs: 117 * H });
    expect(h.resolution).toBe('hour');
    expect(h.reason).toMatch(/3,060 minute aggregates more than 3,000/);
  });

  it('uses aggregates when raw readings of the window were pruned, however short it is', () => {
    const c = chooseResolution({ ...base, toMs: 100 * H + 60_000, prunedThroughMs: 101 * H });
    expect(c.resolution).toBe('minute');
    expect(c.reason).toMatch(/pruned/);
  });
});
