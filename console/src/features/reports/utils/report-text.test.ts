import { describe, expect, it } from 'vitest';
import { signedMetres, spanText } from './report-text';

describe('report text', () => {
  it('says whether a forecast peak came early or late', () => {
    expect(spanText(-2 * 3_600_000 - 15 * 60_000, true)).toBe('2 h 15 min early');
    expect(spanText(40 * 60_000, true)).toBe('40 min late');
    expect(spanText(40 * 60_000)).toBe('40 min');
    expect(spanText(null)).toBe('–');
  });

  it('signs a forecast error in metres', () => {
    expect(signedMetres(0.1234)).toBe('+0.123 m');
    expect(signedMetres(-0.5)).toBe('−0.500 m');
    expect(signedMetres(null)).toBe('–');
  });
});
