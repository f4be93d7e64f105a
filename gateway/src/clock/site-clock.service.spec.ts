import { SiteClockService } from './site-clock.service';
import type { MqttService } from '../mqtt/mqtt.service';

describe('SiteClockService', () => {
  const mqtt = { subscribe: jest.fn() } as unknown as MqttService;
  let wall = 1_000_000;
  const clock = () => new SiteClockService(mqtt, () => wall);
  const msg = (siteTime: string, speed: number) => Buffer.from(JSON.stringify({ siteTime, speed }));

  it('is the wall clock until the site publishes one', () => {
    wall = 5_000;
    expect(clock().snapshot('lake-orrin')).toEqual({ now: 5_000, speed: 1, simulated: false });
  });

  it('extrapolates plant time at the published speed between messages', () => {
    const c = clock();
    wall = 1_000_000;
    c.accept('stillwell/v1/lake-orrin/clock', msg('2026-12-01T00:00:00.000Z', 360));
    wall += 2_000; // two wall seconds = 720 plant seconds
    expect(c.now('lake-orrin')).toBe(Date.parse('2026-12-01T00:12:00.000Z'));
    expect(c.now('other')).toBe(wall);
  });

  it('never runs backwards when a late clock message arrives', () => {
    const c = clock();
    wall = 0;
    c.accept('stillwell/v1/lake-orrin/clock', msg('2026-12-01T01:00:00.000Z', 1));
    const first = c.now('lake-orrin');
    c.accept('stillwell/v1/lake-orrin/clock', msg('2026-12-01T00:59:00.000Z', 1));
    expect(c.now('lake-orrin')).toBe(first);
  });

  it('ignores malformed clock messages', () => {
    const c = clock();
    wall = 42;
    c.accept('stillwell/v1/lake-orrin/clock', Buffer.from('{"siteTime":"yesterday","speed":1}'));
    c.accept('stillwell/v1/lake-orrin/clock', Buffer.from('not json'));
    expect(c.snapshot('lake-orrin').simulated).toBe(false);
  });
});
