import { describe, expect, it } from 'vitest';
import { definition } from '../../../testing/fixtures';
import { buildGaugeModel, spreadLabels } from './gauge-model';
import { freeboardSeverity, levelMarks, levelRange, poolStanding } from './thresholds';

describe('poolStanding', () => {
  it('is normal below every threshold', () => {
    expect(poolStanding(204, definition.thresholds)).toEqual({
      severity: 'normal',
      exceeded: null,
    });
  });

  it('names the highest threshold the pool is above, and takes its severity', () => {
    expect(poolStanding(207.5, definition.thresholds)).toMatchObject({
      severity: 'caution',
      exceeded: { id: 'normal-max' },
    });
    expect(poolStanding(209.2, definition.thresholds)).toMatchObject({
      severity: 'alarm',
      exceeded: { id: 'aux-spillway' },
    });
  });

  it('does not count standing exactly at a threshold as above it', () => {
    expect(poolStanding(207, definition.thresholds).exceeded?.id).toBe('watch');
  });
});

describe('freeboardSeverity', () => {
  it('is an alarm once freeboard is short of the required margin', () => {
    expect(freeboardSeverity(1.6, definition)).toBe('normal');
    expect(freeboardSeverity(1.4, definition)).toBe('alarm');
  });
});

describe('levelMarks and levelRange', () => {
  it('lists the dam crest once, with the thresholds, low to high', () => {
    const marks = levelMarks(definition);
    expect(marks.filter((m) => m.kind === 'dam-crest')).toHaveLength(1);
    expect(marks.map((m) => m.elevation)).toEqual([205.5, 207, 209, 210.5, 212]);
  });

  it('adds the dam crest when no threshold names it', () => {
    const marks = levelMarks({
      ...definition,
      thresholds: definition.thresholds.filter((t) => t.kind !== 'dam-crest'),
    });
    expect(marks.at(-1)).toMatchObject({ kind: 'dam-crest', elevation: 212 });
  });

  it('covers every mark and the pool even when the pool is far below', () => {
    expect(levelRange(definition, 207)).toEqual([204, 213]);
    expect(levelRange(definition, 190.3)).toEqual([189, 213]);
  });
});

describe('buildGaugeModel', () => {
  it('converts the scale, the marks and the pool to US units', () => {
    const model = buildGaugeModel(definition, 207, 'us');
    expect(model.pool?.text).toBe('679.13');
    expect(model.marks.find((m) => m.id === 'dam-crest')?.text).toBe('695.54');
    expect(model.unitText).toBe('ft');
    expect(model.range[0]).toBeCloseTo(204 / 0.3048, 6);
    expect(model.marks.find((m) => m.id === 'watch')?.exceeded).toBe(true);
    expect(model.marks.find((m) => m.id === 'normal-max')?.exceeded).toBe(false);
  });
});

describe('spreadLabels', () => {
  it('moves crowded labels apart and keeps them inside the bounds', () => {
    expect(spreadLabels([10, 12, 100], 20, 0, 200)).toEqual([10, 30, 100]);
    expect(spreadLabels([190, 195, 199], 20, 0, 200)).toEqual([160, 180, 200]);
  });
});
