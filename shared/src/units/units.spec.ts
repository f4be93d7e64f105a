import { describe, expect, it } from 'vitest';
import { ACRE_FOOT_M3, convert, quantityOf, toDisplay } from './units.js';

// Expected factors: NIST Special Publication 811 (2008 edition), Appendix B.8, "Factors for units listed
// alphabetically". The foot, acre and cubic foot per second are exact; the acre-foot is computed from the
// international foot (SP 811 lists 1.233 489 E+03 m3 for the survey-foot acre-foot; we state which we use).
describe('unit conversions against NIST SP 811 factors', () => {
  it('foot to metre is exactly 0.3048', () => {
    expect(convert(1, 'ft', 'm')).toBe(0.3048);
    expect(convert(1000, 'ft', 'm')).toBeCloseTo(304.8, 12);
  });
  it('cubic foot per second to m3/s is 2.831 685 E-02 (exact 0.028316846592)', () => {
    expect(convert(1, 'cfs', 'm3/s')).toBeCloseTo(0.028316846592, 15);
  });
  it('acre to m2 is 4.046 873 E+03 (international-foot acre 4046.8564224)', () => {
    expect(convert(1, 'acre', 'm2')).toBeCloseTo(4046.8564224, 9);
  });
  it('acre-foot (international foot) is 1233.48183754752 m3', () => {
    expect(ACRE_FOOT_M3).toBeCloseTo(1233.48183754752, 9);
    // within 0.0006 % of SP 811's survey-foot figure 1.233 489 E+03
    expect(Math.abs(ACRE_FOOT_M3 - 1233.489) / 1233.489).toBeLessThan(6e-6);
  });
  it('US gallon per minute to m3/s is 6.309 020 E-05', () => {
    expect(convert(1, 'gpm', 'm3/s')).toBeCloseTo(6.30902e-5, 10);
  });
  it('inch per hour is 25.4 mm/h', () => {
    expect(convert(2, 'in/h', 'mm/h')).toBeCloseTo(50.8, 12);
  });
  it('round-trips and refuses to mix quantities', () => {
    expect(convert(convert(123.456, 'm3/s', 'cfs'), 'cfs', 'm3/s')).toBeCloseTo(123.456, 10);
    expect(() => convert(1, 'm', 'cfs')).toThrow(/cannot convert m \(length\) to cfs \(flow\)/);
    expect(quantityOf('ft/h')).toBe('riseRate');
  });
  it('converts SI values to the chosen display system', () => {
    expect(toDisplay(1, 'length', 'us')).toEqual({ value: 1 / 0.3048, unit: 'ft' });
    expect(toDisplay(5, 'flow', 'si')).toEqual({ value: 5, unit: 'm3/s' });
  });
});
