import { describe, expect, it } from 'vitest';
import { valueText } from './alarm-text';

describe('an alarm’s value', () => {
  it('reads a silence as a time, not a bare number of seconds', () => {
    expect(valueText({ kind: 'channel-stale', value: 1295, limit: null, unit: null })).toBe(
      '22 min',
    );
    expect(valueText({ kind: 'time-left', value: 5400, limit: 7200, unit: null })).toBe(
      '1 h 30 min (limit 2 h 0 min)',
    );
  });

  it('counts a burst of out-of-range messages', () => {
    expect(valueText({ kind: 'out-of-range-burst', value: 7, limit: null, unit: null })).toBe(
      '7 out of range',
    );
  });

  it('reads seepage in litres per second and levels in metres', () => {
    expect(valueText({ kind: 'seepage-high', value: 0.0172, limit: 0.015, unit: 'm3/s' })).toBe(
      '17.2 l/s (limit 15.0 l/s)',
    );
    expect(valueText({ kind: 'pool-high', value: 205.62, limit: 205.5, unit: 'm' })).toBe(
      '205.62 m (limit 205.50 m)',
    );
  });
});
