import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { alarmPerformance } from '@stillwell/shared/alarms';
import { makeAlarmList } from '../../../testing/alarm-fixtures';
import { definition, makeStatus, SITE_NOW } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';
import { stubFetch } from '../../../testing/stub-fetch';

vi.mock('uplot', async () => ({
  default: (await import('../../../testing/fake-uplot')).FakeUPlot,
}));

const base = `/api/reservoirs/${definition.id}`;

describe('alarm rates screen', () => {
  it('shows the rates against the benchmarks, and a flood as one', async () => {
    const from = SITE_NOW - 24 * 3_600_000;
    // a burst of 12 alarms in 6 minutes: a flood (10 or more in 10 minutes)
    const events = Array.from({ length: 12 }, (_, i) => ({
      conditionId: `c${i % 4}`,
      timeMs: from + 3_600_000 + i * 30_000,
      priority: 'prompt' as const,
    }));
    const { calls } = stubFetch({
      [base]: { version: 3, definition },
      [`${base}/status`]: makeStatus(),
      [`${base}/alarms`]: makeAlarmList([]),
      [`${base}/alarms/performance`]: alarmPerformance(events, from, SITE_NOW),
    });
    renderApp(`/reservoirs/${definition.id}/alarm-rates`);
    expect((await screen.findByTestId('rate-total')).textContent).toBe('12');
    expect(screen.getByTestId('rate-peak').textContent).toBe('12');
    expect(screen.getByTestId('rate-floods').textContent).toBe('1 (0.7 %)');
    expect(screen.getByTestId('rate-verdict').textContent).toMatch(
      /acceptable rate.*there was a flood/,
    );
    expect(screen.getAllByTestId('period-bar')).toHaveLength(1);
    await waitFor(() => {
      const q = calls.find((u) => u.pathname.endsWith('/performance'))!.searchParams;
      expect(Date.parse(q.get('to')!)).toBe(SITE_NOW);
      expect(Date.parse(q.get('from')!)).toBe(from);
    });
  });
});
