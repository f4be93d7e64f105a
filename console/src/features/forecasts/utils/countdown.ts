import type { ForecastUpdate } from '@stillwell/shared/forecasts';
import type { Severity } from '../../../lib/severity';

/**
 * ok / soon / urgent: there is time, less of it in that order; past: the latest start has gone
 * (said by the gateway, or reached here while waiting for the next run); impossible: the standard
 * plan is not enough even now; not-needed: the forecast peak stays below the target; none: no run.
 */
export type CountdownState =
  'ok' | 'soon' | 'urgent' | 'past' | 'impossible' | 'not-needed' | 'none';

/** Site time left at which the countdown asks for attention, then insists. */
export const SOON_S = 2 * 3600;
export const URGENT_S = 30 * 60;
/** a run older than this (site time) is shown as in doubt: the forecast has stopped renewing */
export const STALE_FORECAST_S = 15 * 60;

export interface Countdown {
  state: CountdownState;
  severity: Severity;
  /** site seconds until the latest start (negative once past), null when there is none */
  remainingS: number | null;
  /** the countdown itself, e.g. 2:05:09, or −0:12:30 once past; '—' without one */
  clock: string;
  headline: string;
  detail: string;
  /** the run is old: the figures may have moved on */
  stale: boolean;
  /** site seconds since the run */
  ageS: number | null;
}

/** h:mm:ss of a duration in seconds, with a minus sign before a negative one. */
export function formatCountdown(seconds: number): string {
  const sign = seconds < 0 ? '−' : '';
  const s = Math.floor(Math.abs(seconds));
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = s % 60;
  return `${sign}${h}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}`;
}

export function countdownOf(
  update: ForecastUpdate | undefined,
  siteNowMs: number | null,
): Countdown {
  const run = update?.run ?? null;
  if (!run) {
    return {
      state: 'none',
      severity: 'normal',
      remainingS: null,
      clock: '—',
      headline: 'No forecast yet',
      detail: update?.problem ?? 'Waiting for the first forecast run.',
      stale: true,
      ageS: null,
    };
  }
  const now = siteNowMs ?? run.computedAtMs;
  const ageS = Math.max(0, (now - run.computedAtMs) / 1000);
  const stale = ageS > STALE_FORECAST_S;
  const notRenewed = update?.problem ? ` Not renewed: ${update.problem}.` : '';
  const t = run.timeLeft;
  const base = { stale, ageS };
  switch (t.status) {
    case 'not-needed':
      return {
        ...base,
        state: 'not-needed',
        severity: 'normal',
        remainingS: null,
        clock: '—',
        headline: 'No action needed',
        detail: `${t.message}.${notRenewed}`,
      };
    case 'impossible':
      return {
        ...base,
        state: 'impossible',
        severity: 'alarm',
        remainingS: null,
        clock: '—',
        headline: 'Standard plan not enough',
        detail: `${t.message}.${notRenewed}`,
      };
    case 'past': {
      const remainingS = t.latestStartMs === null ? null : (t.latestStartMs - now) / 1000;
      return {
        ...base,
        state: 'past',
        severity: 'alarm',
        remainingS,
        clock: remainingS === null ? '—' : formatCountdown(remainingS),
        headline: 'Too late for the standard plan',
        detail: `${t.message}.${notRenewed}`,
      };
    }
    case 'ok': {
      const remainingS = (t.latestStartMs! - now) / 1000;
      if (remainingS < 0) {
        return {
          ...base,
          state: 'past',
          severity: 'alarm',
          remainingS,
          clock: formatCountdown(remainingS),
          headline: 'Too late for the standard plan',
          detail: `The latest start has passed while waiting for the next forecast run. ${t.message}.${notRenewed}`,
        };
      }
      const state = remainingS <= URGENT_S ? 'urgent' : remainingS <= SOON_S ? 'soon' : 'ok';
      return {
        ...base,
        state,
        severity: state === 'urgent' ? 'alarm' : state === 'soon' ? 'caution' : 'normal',
        remainingS,
        clock: formatCountdown(remainingS),
        headline: 'Time left to act',
        detail: `${capitalise(t.message)}.${notRenewed}`,
      };
    }
  }
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
