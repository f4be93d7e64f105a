import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import { describe, expect, it } from 'vitest';
import { channelReaders } from '../devices/channels.js';
import { createRandom } from './rng.js';
import { DamInstruments } from './instruments.js';

describe('seepage weirs and piezometers', () => {
  it('start on their steady state and follow a step of the pool with their lag', () => {
    const d = new DamInstruments(DEMO_RESERVOIR, 204.5, undefined);
    const q0 = d.current.seepage['weir-left']!;
    const p0 = d.current.piezometers['p1']!;
    const p30 = d.current.piezometers['p3']!;
    expect(q0).toBeGreaterThan(0.004);
    expect(q0).toBeLessThan(0.006);
    // the pool jumps 4 m: after one time constant (4 h x 1.1) about 63 % of the change is seen
    let seen = d.current;
    for (let i = 0; i < 4.4 * 360; i++) seen = d.step(10, 208.5, i / 360);
    const far = new DamInstruments(DEMO_RESERVOIR, 208.5, undefined).current;
    const share = (seen.seepage['weir-left']! - q0) / (far.seepage['weir-left']! - q0);
    expect(share).toBeGreaterThan(0.6);
    expect(share).toBeLessThan(0.66);
    // P1 (lag 2 h) has come nearly all the way; P3 (lag 6 h) not
    expect((seen.piezometers['p1']! - p0) / (far.piezometers['p1']! - p0)).toBeGreaterThan(0.85);
    expect((seen.piezometers['p3']! - p30) / (far.piezometers['p3']! - p30)).toBeLessThan(0.55);
  });

  it('the weir channel reports the head over the notch that its seepage makes, with noise', () => {
    const reader = channelReaders(DEMO_RESERVOIR).find((r) => r.channel.id === 'seepage.left')!;
    const state = { instruments: { seepage: { 'weir-left': 0.0247 }, piezometers: {}, leak: 0 } };
    const head = reader.read(state as never);
    expect(head).toBeCloseTo(0.2, 3); // REFERENCES.md: 0.0247 m3/s at h = 0.2 m (90-degree notch)
    const measured = reader.measure(head, createRandom(1));
    expect(Math.abs(measured - head)).toBeLessThan(0.003);
    expect(measured.toString()).toMatch(/^0\.\d{1,4}$/);
  });
});
