import { describe, expect, it } from 'vitest';
import { fromSiteField, toSiteField, zoneOffsetMs } from './site-time-field';

const HOUR = 3_600_000;

describe('site-time fields', () => {
  it('reads a wall time in the site zone, winter and summer', () => {
    // London: GMT in January, BST (UTC+1) in July
    expect(fromSiteField('2026-01-15T10:30', 'Europe/London')).toBe(Date.UTC(2026, 0, 15, 10, 30));
    expect(fromSiteField('2026-07-15T10:30', 'Europe/London')).toBe(Date.UTC(2026, 6, 15, 9, 30));
    expect(fromSiteField('2026-07-15T10:30', 'America/Denver')).toBe(Date.UTC(2026, 6, 15, 16, 30));
  });

  it('writes a moment as the site wall clock, and reads it back to the same moment', () => {
    const t = Date.UTC(2026, 6, 15, 23, 45);
    expect(toSiteField(t, 'Europe/London')).toBe('2026-07-16T00:45');
    expect(fromSiteField(toSiteField(t, 'Asia/Kolkata'), 'Asia/Kolkata')).toBe(t);
    expect(zoneOffsetMs(t, 'Asia/Kolkata')).toBe(5.5 * HOUR);
  });

  it('refuses text that is not a time', () => {
    expect(fromSiteField('', 'Europe/London')).toBeNaN();
    expect(fromSiteField('yesterday', 'Europe/London')).toBeNaN();
  });
});
