import { describe, expect, it } from 'vitest';
import { formatAge, formatQuantity, formatSiteTime } from './format';

describe('formatQuantity', () => {
  it('shows lengths in metres or feet with two decimals', () => {
    expect(formatQuantity(207, 'length', 'si')).toMatchObject({ text: '207.00', unitText: 'm' });
    // 207 / 0.3048 = 679.1338...
    expect(formatQuantity(207, 'length', 'us')).toMatchObject({ text: '679.13', unitText: 'ft' });
  });

  it('shows flows in m³/s or whole cfs', () => {
    expect(formatQuantity(850, 'flow', 'si')).toMatchObject({ text: '850.0', unitText: 'm³/s' });
    // 850 / 0.028316846592 = 30017.4...
    expect(formatQuantity(850, 'flow', 'us')).toMatchObject({ text: '30,017', unitText: 'cfs' });
  });

  it('signs a rate of rise when asked', () => {
    expect(formatQuantity(0.125, 'riseRate', 'si', { signed: true }).text).toBe('+0.125');
    expect(formatQuantity(-0.125, 'riseRate', 'us', { signed: true }).text).toBe('-0.41');
  });
});

describe('formatAge', () => {
  it('reads coarsely as ages grow', () => {
    expect(formatAge(42.4)).toBe('42 s');
    expect(formatAge(600)).toBe('10 min');
    expect(formatAge(3 * 3600 + 15 * 60)).toBe('3 h 15 min');
    expect(formatAge(5 * 86_400)).toBe('5 d');
  });
});

describe('formatSiteTime', () => {
  it("shows the site's local time with its zone named, across a daylight-saving change", () => {
    const winter = formatSiteTime(Date.UTC(2026, 0, 15, 14, 5, 9), 'Europe/London');
    expect(winter).toMatchObject({ time: '14:05:09', zone: 'GMT' });
    const summer = formatSiteTime(Date.UTC(2026, 6, 15, 14, 5, 9), 'Europe/London');
    expect(summer).toMatchObject({ time: '15:05:09', zone: 'BST' });
    expect(summer.date).toContain('2026');
  });

  it('uses the given zone, not the computer’s', () => {
    const t = Date.UTC(2026, 0, 15, 14, 0, 0);
    expect(formatSiteTime(t, 'America/Denver').time).toBe('07:00:00');
  });
});
