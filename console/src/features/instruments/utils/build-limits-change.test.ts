import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { ApiError } from '../../../lib/api-client';
import { buildLimitsChange } from './build-limits-change';
import { describeChange, initialValues, limitFields } from './limit-fields';
import { placeProblems, problemsOfError } from './limits-problems';

const def = DEMO_RESERVOIR;
const fields = limitFields(def, 'si');
const NOTE = 'seepage survey of the left abutment';

function build(edits: Record<string, string>, note = NOTE) {
  return buildLimitsChange(def, 7, fields, { ...initialValues(fields), ...edits }, note);
}

describe('the limits form’s request', () => {
  it('shows seepage in l/s and levels in m, exactly as stored', () => {
    const shown = initialValues(fields);
    // the demo definition: left weir alarm at 0.015 m3/s, Watch level at 205.5 m
    expect(shown['weir.weir-left.maxFlow']).toBe('15');
    expect(shown['alert.watch']).toBe('205.5');
    expect(shown['weir.weir-left.baseline.tolerance']).toBe('30');
    expect(shown['rateOfRise.limit']).toBe('0.3');
  });

  it('sends a changed seepage limit in m3/s, on the version it was opened on, the rest as stored', () => {
    const built = build({ 'weir.weir-left.maxFlow': '16.3' });
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    expect(built.change.baseVersion).toBe(7);
    // 16.3 x 0.001 is 0.016300000000000002 in floating point: stored as people wrote it
    expect(built.change.seepageWeirs?.[0]?.maxFlow).toBe(0.0163);
    expect(built.change.seepageWeirs?.[1]).toEqual({
      id: 'weir-right',
      maxFlow: def.seepageWeirs![1]!.maxFlow,
      baseline: def.seepageWeirs![1]!.baseline,
    });
    // no alarm section is rewritten when its limit stays
    expect(built.change.alarms).toBeUndefined();
    expect(built.changes.map((c) => c.field)).toEqual(['seepageWeirs.weir-left.maxFlow']);
  });

  it('replaces the rate-of-rise section whole, with only its limit changed', () => {
    const built = build({ 'rateOfRise.limit': '0.25' });
    expect(built.ok && built.change.alarms).toEqual({
      rateOfRise: { ...def.alarms!.rateOfRise!, limit: 0.25 },
    });
  });

  it('converts from feet back to metres, leaving untouched levels exact', () => {
    const us = limitFields(def, 'us');
    const values = { ...initialValues(us), 'piezometer.p1.maxLevel': '650' };
    const built = buildLimitsChange(def, 7, us, values, NOTE);
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    // 650 ft x 0.3048 m/ft (the international foot, exact by definition)
    expect(built.change.piezometers?.[0]?.maxLevel).toBeCloseTo(198.12, 9);
    expect(built.change.alertLevels?.find((a) => a.id === 'watch')?.elevation).toBe(205.5);
  });

  it('names the field that is not a number, and sends nothing', () => {
    const built = build({ 'weir.weir-right.baseline.referenceFlow': '4,2', 'alert.watch': '' });
    expect(built).toEqual({
      ok: false,
      fields: {
        'weir.weir-right.baseline.referenceFlow': 'enter a number',
        'alert.watch': 'enter a number',
      },
      general: [],
    });
  });

  it('puts the shared rules’ refusals beside their fields', () => {
    const built = build(
      {
        'weir.weir-left.maxFlow': '-1',
        'weir.weir-right.baseline.referencePool': '180',
        'piezometer.p2.baseline.ratio': '120',
      },
      'ok',
    );
    expect(built.ok).toBe(false);
    if (built.ok) return;
    expect(Object.keys(built.fields).sort()).toEqual([
      'note',
      'piezometer.p2.baseline.ratio',
      'weir.weir-left.maxFlow',
    ]);
    expect(built.fields.note).toMatch(/say why the limits change/);

    // once the request itself is sound, the definition's own cross-checks speak
    const crossed = build({ 'weir.weir-right.baseline.referencePool': '180' });
    expect(!crossed.ok && crossed.fields).toEqual({
      'weir.weir-right.baseline.referencePool': 'must be above zeroFlowPool',
    });
  });

  it('keeps an alert level between the riverbed and the dam crest', () => {
    const built = build({ 'alert.normal-max': String(def.damCrestElevation + 1) });
    expect(!built.ok && built.fields['alert.normal-max']).toMatch(/between the riverbed/);
  });

  it('says when nothing has changed', () => {
    const built = build({});
    expect(!built.ok && built.general).toEqual(['no limit differs from the current version']);
  });
});

describe('the gateway’s refusals', () => {
  const refusal = (body: unknown, details: string[]) =>
    new ApiError(400, details.join('; '), '/x', details, undefined, body);

  it('reads its problems list, path by path', () => {
    const error = refusal(
      {
        problems: [
          { field: 'seepageWeirs[0].maxFlow', message: 'seepageWeirs[0].maxFlow: too high' },
        ],
      },
      ['seepageWeirs[0].maxFlow: too high'],
    );
    expect(placeProblems(fields, problemsOfError(error))).toEqual({
      fields: { 'weir.weir-left.maxFlow': 'too high' },
      general: [],
    });
  });

  it('reads "path: message" lines when there is no list, keeping the unplaced above the form', () => {
    const error = refusal({ message: [] }, [
      'piezometers[3].maxLevel: must be a number',
      'thresholds[0].elevation: below the riverbed',
      'baseVersion: expected an integer',
      'something went wrong',
    ]);
    const placed = placeProblems(fields, problemsOfError(error));
    expect(placed.fields).toEqual({
      'piezometer.p4.maxLevel': 'must be a number',
      'alert.watch': 'below the riverbed',
    });
    expect(placed.general).toEqual(['baseVersion: expected an integer', 'something went wrong']);
  });
});

describe('a saved change, as the form says it', () => {
  it('names the field by its label and shows the values in the person’s units', () => {
    const change = { field: 'seepageWeirs.weir-left.maxFlow', from: 0.015, to: 0.0165 };
    expect(describeChange(fields, change)).toBe('Left abutment weir, alarm above: 15 → 16.5 l/s');
    expect(
      describeChange(limitFields(def, 'us'), {
        field: 'thresholds.watch.elevation',
        from: 205.5,
        to: 205.8,
      }),
    ).toBe('Pool, watch level: 674.21 → 675.2 ft');
  });

  it('names a field the form does not show as the gateway does', () => {
    const change = { field: 'alarms.seepage.onDelayS', from: 900, to: 600 };
    expect(describeChange(fields, change)).toBe('alarms.seepage.onDelayS: 900 → 600');
  });
});
