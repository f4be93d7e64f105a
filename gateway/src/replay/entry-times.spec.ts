import { ClockMapping, recordedSiteTime } from './entry-times';

describe('ClockMapping', () => {
  it('is the identity without anchors (no readings to go by)', () => {
    const m = new ClockMapping(null, null);
    expect(m.toSite(1234)).toBe(1234);
    expect(m.toWall(1234)).toBe(1234);
  });

  it('follows a plant clock running 360 times faster, both ways', () => {
    const a = { siteMs: 1_000_000, wallMs: 50_000 };
    const b = { siteMs: 1_000_000 + 360 * 10_000, wallMs: 60_000 };
    const m = new ClockMapping(a, b);
    expect(m.toSite(55_000)).toBe(1_000_000 + 360 * 5_000);
    expect(m.toWall(m.toSite(57_500))).toBeCloseTo(57_500, 6);
  });

  it('keeps slope 1 with a single anchor (offset only)', () => {
    const a = { siteMs: 10_000, wallMs: 10_500 };
    expect(new ClockMapping(a, a).toSite(11_500)).toBe(11_000);
  });
});

describe('recordedSiteTime', () => {
  it('reads payload.siteTime and refuses anything that is not a time', () => {
    expect(recordedSiteTime({ siteTime: '2026-12-02T03:04:05.000Z' })).toBe(
      Date.UTC(2026, 11, 2, 3, 4, 5),
    );
    expect(recordedSiteTime({ siteTime: 'soon' })).toBeNull();
    expect(recordedSiteTime({ siteTime: 17 })).toBeNull();
    expect(recordedSiteTime({})).toBeNull();
  });
});
