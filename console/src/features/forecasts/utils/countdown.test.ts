import { describe, expect, it } from 'vitest';
import { SITE_NOW } from '../../../testing/fixtures';
import { makeRun, makeUpdate } from '../../../testing/forecast-fixtures';
import { countdownOf, formatCountdown } from './countdown';

const H = 3600_000;
const withTimeLeft = (timeLeft: Partial<ReturnType<typeof makeRun>['timeLeft']>) => {
  const run = makeRun();
  return makeUpdate({ ...run, timeLeft: { ...run.timeLeft, ...timeLeft } });
};

describe('countdownOf', () => {
  it('counts down to the latest start in site time, and asks for attention as it nears', () => {
    const update = makeUpdate();
    const fresh = countdownOf(update, SITE_NOW);
    expect(fresh).toMatchObject({
      state: 'ok',
      severity: 'normal',
      clock: '2:30:00',
      remainingS: 9000,
    });
    expect(fresh.headline).toBe('Time left to act');
    expect(fresh.detail).toMatch(/^Open all 3 spillway gates fully/);
    expect(countdownOf(update, SITE_NOW + H)).toMatchObject({
      state: 'soon',
      severity: 'caution',
      clock: '1:30:00',
    });
    expect(countdownOf(update, SITE_NOW + 2.25 * H)).toMatchObject({
      state: 'urgent',
      severity: 'alarm',
      clock: '0:15:00',
    });
  });

  it('turns to past once the latest start has gone by, before the next run says so', () => {
    const c = countdownOf(makeUpdate(), SITE_NOW + 2.5 * H + 90_000);
    expect(c).toMatchObject({ state: 'past', severity: 'alarm', clock: '−0:01:30' });
    expect(c.headline).toBe('Too late for the standard plan');
  });

  it('says past, impossible and not needed plainly', () => {
    const past = countdownOf(
      withTimeLeft({
        status: 'past',
        latestStartMs: SITE_NOW - 2 * H,
        message: 'too late for the standard plan: it had to start by 12:00',
      }),
      SITE_NOW,
    );
    expect(past).toMatchObject({
      state: 'past',
      clock: '−2:00:00',
      headline: 'Too late for the standard plan',
    });
    const impossible = countdownOf(
      withTimeLeft({
        status: 'impossible',
        latestStartMs: null,
        message: 'even started now, the plan gives 211.05 m',
      }),
      SITE_NOW,
    );
    expect(impossible).toMatchObject({
      state: 'impossible',
      severity: 'alarm',
      clock: '—',
      headline: 'Standard plan not enough',
    });
    const calm = countdownOf(
      withTimeLeft({ status: 'not-needed', latestStartMs: null, message: 'no action needed' }),
      SITE_NOW,
    );
    expect(calm).toMatchObject({
      state: 'not-needed',
      severity: 'normal',
      headline: 'No action needed',
    });
  });

  it('marks an old run as in doubt, and says why none could be made', () => {
    expect(countdownOf(makeUpdate(), SITE_NOW + 20 * 60_000).stale).toBe(true);
    expect(countdownOf(makeUpdate(), SITE_NOW + 10 * 60_000).stale).toBe(false);
    const none = countdownOf(makeUpdate(null, 'no usable pool reading'), SITE_NOW);
    expect(none).toMatchObject({
      state: 'none',
      headline: 'No forecast yet',
      detail: 'no usable pool reading',
    });
    expect(
      countdownOf(makeUpdate(makeRun(), 'the inflow gauge is silent'), SITE_NOW).detail,
    ).toContain('Not renewed: the inflow gauge is silent.');
  });

  it('formats hours, minutes and seconds', () => {
    expect(formatCountdown(3 * 3600 + 5 * 60 + 9.9)).toBe('3:05:09');
    expect(formatCountdown(-59)).toBe('−0:00:59');
  });
});
