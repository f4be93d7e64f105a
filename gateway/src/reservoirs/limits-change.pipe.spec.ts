import { BadRequestException } from '@nestjs/common';
import { LimitsChangePipe } from './limits-change.pipe';

/** The 400 body the pipe throws for a value, or null when it passes. */
function refusal(value: unknown): { message: string[]; problems: { field: string }[] } | null {
  try {
    new LimitsChangePipe().transform(value);
    return null;
  } catch (error) {
    if (!(error instanceof BadRequestException)) throw error;
    return error.getResponse() as { message: string[]; problems: { field: string }[] };
  }
}

describe('LimitsChangePipe', () => {
  const valid = {
    baseVersion: 3,
    note: 'drain survey',
    seepageWeirs: [{ id: 'weir-left', maxFlow: 0.01 }],
  };

  it('passes a valid change through, note trimmed', () => {
    expect(new LimitsChangePipe().transform({ ...valid, note: '  drain survey ' })).toEqual(valid);
  });

  it('names each field at fault, as people write paths', () => {
    const r = refusal({
      ...valid,
      baseVersion: 0,
      seepageWeirs: [{ id: 'weir-left', maxFlow: -1 }],
    });
    expect(r?.problems.map((p) => p.field).sort()).toEqual([
      'baseVersion',
      'seepageWeirs[0].maxFlow',
    ]);
    expect(
      r?.message.every((line) => /^(baseVersion|seepageWeirs\[0\]\.maxFlow): /.test(line)),
    ).toBe(true);
  });

  it('refuses an unknown field and a missing body', () => {
    expect(refusal({ ...valid, structures: [] })?.message.join()).toMatch(/structures/);
    expect(refusal(undefined)?.problems.map((p) => p.field)).toEqual(
      expect.arrayContaining(['baseVersion', 'note']),
    );
  });
});
