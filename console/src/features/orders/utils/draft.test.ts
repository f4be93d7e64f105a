import { describe, expect, it } from 'vitest';
import { controlsOf } from '@stillwell/shared/orders';
import { definition } from '../../../testing/fixtures';
import { describeTargets, draftProblems, emptyDraft, toRequest } from './draft';

const NOW = Date.UTC(2026, 2, 3, 14);

describe('the draft form', () => {
  it('sends only the targets that were typed, with the planned start in site time', () => {
    const values = emptyDraft(definition);
    values.steps[0]!.targets['gate-2'] = '4.5';
    values.reason = 'lower the pool ahead of the peak';
    values.startInMin = '15';
    expect(toRequest(values, NOW)).toEqual({
      steps: [{ offsetMin: 0, targets: [{ control: 'gate-2', target: 4.5 }] }],
      reason: 'lower the pool ahead of the peak',
      plannedStart: new Date(NOW + 15 * 60_000).toISOString(),
    });
  });

  it('names every problem by its field, with the same rules as the gateway', () => {
    const values = emptyDraft(definition);
    values.steps[0]!.targets['gate-1'] = '9.5';
    values.steps.push({ offsetMin: '0', targets: {} });
    const problems = draftProblems(toRequest(values, NOW), definition);
    expect(problems).toEqual(
      expect.arrayContaining([
        'reason: at least 5 characters',
        'steps.1.targets: name at least one gate or valve',
        'steps.1.offsetMin: each step must come after the one before',
        expect.stringMatching(
          /^steps\.0\.targets\.0\.target: Gate 1 .*9\.5 m is outside its limits 0\.\.9 m/,
        ),
      ]),
    );
  });

  it('describes targets in words', () => {
    expect(
      describeTargets(
        [
          { control: 'gate-1', target: 2 },
          { control: 'low-level-outlet', target: 40 },
        ],
        controlsOf(definition),
      ),
    ).toBe('Gate 1 to 2.00 m, Low-level outlet valve to 40.0 %');
  });
});
