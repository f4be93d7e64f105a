import { describe, expect, it } from 'vitest';
import { alarmSettingsOf } from '../alarms/settings.js';
import { DEMO_RESERVOIR } from './demo.js';
import { applyLimitsChange, limitsChangeSchema, type LimitsChange } from './limits-change.js';

const base = { baseVersion: 1, note: 'after the 2026 seepage survey' };
const apply = (c: Omit<LimitsChange, 'baseVersion' | 'note'>) =>
  applyLimitsChange(DEMO_RESERVOIR, { ...base, ...c });

describe('limits change', () => {
  it('changes a weir limit and baseline, an alert level and an alarm section, and lists each change', () => {
    const r = apply({
      seepageWeirs: [{ id: 'weir-left', maxFlow: 0.02, baseline: { tolerance: 0.25 } }],
      alertLevels: [{ id: 'watch', elevation: 205 }],
      alarms: { rateOfRise: { ...alarmSettingsOf(DEMO_RESERVOIR).rateOfRise, limit: 0.25 } },
    });
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const left = r.definition.seepageWeirs!.find((w) => w.id === 'weir-left')!;
    expect(left.maxFlow).toBe(0.02);
    expect(left.baseline).toEqual({
      ...DEMO_RESERVOIR.seepageWeirs![0]!.baseline,
      tolerance: 0.25,
    });
    expect(r.definition.thresholds.find((t) => t.id === 'watch')?.elevation).toBe(205);
    // sections not given stay as they were
    expect(r.definition.alarms?.massBalance).toEqual(DEMO_RESERVOIR.alarms?.massBalance);
    expect(r.changes).toEqual(
      expect.arrayContaining([
        { field: 'seepageWeirs.weir-left.maxFlow', from: 0.015, to: 0.02 },
        { field: 'seepageWeirs.weir-left.baseline.tolerance', from: 0.3, to: 0.25 },
        { field: 'thresholds.watch.elevation', from: 205.5, to: 205 },
        { field: 'alarms.rateOfRise.limit', from: 0.3, to: 0.25 },
      ]),
    );
    expect(r.changes).toHaveLength(4);
    // the definition given is not touched
    expect(DEMO_RESERVOIR.seepageWeirs![0]!.maxFlow).toBe(0.015);
  });

  it('names the field of each refusal', () => {
    const unknown = apply({ seepageWeirs: [{ id: 'weir-centre', maxFlow: 0.01 }] });
    expect(unknown).toEqual({
      ok: false,
      problems: [{ field: 'seepageWeirs[0].id', message: 'no seepage weir "weir-centre"' }],
    });
    const physical = apply({ alertLevels: [{ id: 'dam-crest', elevation: 213 }] });
    expect(!physical.ok && physical.problems[0]!.field).toBe('alertLevels[0].id');
    const outside = apply({ alertLevels: [{ id: 'watch', elevation: 230 }] });
    expect(!outside.ok && outside.problems[0]!.field).toBe('alertLevels[0].elevation');
    const baseline = apply({
      seepageWeirs: [{ id: 'weir-right', baseline: { referencePool: 150 } }],
    });
    expect(!baseline.ok && baseline.problems[0]!.field).toBe(
      'seepageWeirs[1].baseline.referencePool',
    );
    const none = apply({ seepageWeirs: [{ id: 'weir-left', maxFlow: 0.015 }] });
    expect(!none.ok && none.problems[0]!.message).toMatch(/no limit differs/);
  });

  it('the request schema refuses a missing reason and a negative limit, naming the path', () => {
    const bad = limitsChangeSchema.safeParse({
      baseVersion: 1,
      note: ' ',
      seepageWeirs: [{ id: 'weir-left', maxFlow: -1 }],
    });
    expect(bad.success).toBe(false);
    const paths = bad.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['note', 'seepageWeirs.0.maxFlow']));
    // nothing else than limits: the channel a weir reports on is not a limit
    const channel = limitsChangeSchema.safeParse({
      ...base,
      seepageWeirs: [{ id: 'weir-left', channel: 'seepage.right' }],
    });
    expect(channel.success).toBe(false);
  });
});
