import { describe, expect, it } from 'vitest';
import {
  DEMO_RESERVOIR,
  reservoirDefinitionSchema,
  type ReservoirDefinition,
} from '../reservoirs/index.js';
import { buildConditions } from './conditions.js';
import { alarmSettingsOf } from './settings.js';

describe('the alarm conditions of a definition', () => {
  const conditions = buildConditions(DEMO_RESERVOIR);
  const ids = conditions.map((c) => c.id);

  it('has one of each kind the demo reservoir needs, with unique ids', () => {
    expect(new Set(ids).size).toBe(ids.length);
    for (const id of [
      'pool-high.watch',
      'pool-high.dam-crest',
      'rate-of-rise',
      'forecast-crossing.freeboard-limit',
      'time-left',
      'gauge-disagreement',
      'stale.pool-radar',
      'telemetry-silent',
      'frozen.pool.radar',
      'out-of-range.inflow',
      'gate-not-following.gate-1',
      'gate-not-following.low-level-outlet',
      'seepage-high.weir-left',
      'seepage-baseline.weir-right',
      'piezometer-high.p4',
      'mass-balance',
    ])
      expect(ids).toContain(id);
  });

  it('takes pool priorities from the definition, and by threshold kind when it lists none', () => {
    expect(conditions.find((c) => c.id === 'pool-high.freeboard-limit')?.priority).toBe(
      'immediate',
    );
    const bare: ReservoirDefinition = { ...DEMO_RESERVOIR, alarms: undefined };
    const byKind = buildConditions(bare);
    expect(byKind.find((c) => c.id === 'pool-high.watch')?.priority).toBe('advisory');
    expect(byKind.find((c) => c.id === 'pool-high.aux-spillway')?.priority).toBe('prompt');
    expect(byKind.find((c) => c.id === 'pool-high.dam-crest')?.priority).toBe('immediate');
    // the defaults equal what the demo states: the demo spells them out for review
    expect(alarmSettingsOf(bare).massBalance).toEqual(DEMO_RESERVOIR.alarms!.massBalance);
    const byChannel = (list: readonly { channel: string }[]) =>
      [...list].sort((a, b) => a.channel.localeCompare(b.channel));
    expect(byChannel(alarmSettingsOf(bare).frozen)).toEqual(
      byChannel(DEMO_RESERVOIR.alarms!.frozen!),
    );
  });

  it('keeps most alarms at the lowest priorities (ISA-18.2: few at the top)', () => {
    const top = conditions.filter((c) => c.priority === 'immediate').length;
    expect(top / conditions.length).toBeLessThan(0.25);
  });
});

describe('the definition schema refuses broken alarm and instrument settings', () => {
  const parse = (d: unknown) => reservoirDefinitionSchema.safeParse(d);
  it('accepts the demo and a definition without any of the new sections', () => {
    expect(parse(DEMO_RESERVOIR).success).toBe(true);
    const { seepageWeirs: _w, piezometers: _p, alarms: _a, ...old } = DEMO_RESERVOIR;
    expect(parse(old).success).toBe(true);
  });

  it('refuses a weir on a channel of the wrong role, an unknown threshold and a 60-degree notch without coefficients', () => {
    const weir = DEMO_RESERVOIR.seepageWeirs![0]!;
    expect(
      parse({ ...DEMO_RESERVOIR, seepageWeirs: [{ ...weir, channel: 'inflow' }] }).success,
    ).toBe(false);
    expect(
      parse({ ...DEMO_RESERVOIR, seepageWeirs: [{ ...weir, notchAngleDeg: 60 }] }).success,
    ).toBe(false);
    expect(
      parse({
        ...DEMO_RESERVOIR,
        alarms: {
          poolLevels: [{ thresholdId: 'nowhere', priority: 'prompt', deadband: 0, onDelayS: 0 }],
        },
      }).success,
    ).toBe(false);
    expect(
      parse({
        ...DEMO_RESERVOIR,
        alarms: {
          forecast: { thresholds: ['x'], horizonS: 1, timeLeftMarginS: 1, timeLeftDeadbandS: 0 },
        },
      }).success,
    ).toBe(false);
  });
});
