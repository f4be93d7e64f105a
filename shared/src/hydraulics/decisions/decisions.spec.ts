import { describe, expect, it } from 'vitest';
import { DEMO_RESERVOIR } from '../../reservoirs/demo.js';
import { compileOutflow } from '../outflow-model.js';
import { routeStorageIndication } from '../route.js';
import { createStorageCurve } from '../storage-curve.js';
import { gammaStorm } from '../testing/fixtures.js';
import { compareSchedules } from './compare.js';
import { prepareScenario, smallestOpening } from './search.js';
import { timeToThresholds } from './thresholds.js';
import { latestStart } from './time-left.js';

const H = 3600;
const storage = createStorageCurve(DEMO_RESERVOIR.storageTable);
const inflow = gammaStorm({
  base: 50,
  peak: 1900,
  peakTime: 30 * H,
  shape: 3.7,
  duration: 72 * H,
  dt: 600,
});
const base = {
  storage,
  structures: DEMO_RESERVOIR.structures,
  inflow,
  initialElevation: 204.5,
  duration: 72 * H,
  dt: 60,
};
const gates = ['gate-1', 'gate-2', 'gate-3'];
const openAll = (x: number, time = 0) => gates.map((id) => ({ time, id, target: x }));

describe('timeToThresholds', () => {
  const series = { time: [0, 10, 20, 30, 40], elevation: [1, 2, 3, 2, 1] };
  it('interpolates the first crossing and the time spent above', () => {
    const [a, b, c, d] = timeToThresholds(series, [
      { id: 'a', elevation: 1.5 },
      { id: 'b', elevation: 2.5 },
      { id: 'c', elevation: 5 },
      { id: 'd', elevation: 0.5 },
    ]);
    expect(a).toMatchObject({ time: 5, leadTime: 5, alreadyAbove: false, timeAbove: 30 });
    expect(b).toMatchObject({ time: 15, timeAbove: 10 });
    expect(c).toMatchObject({ time: null, leadTime: null, timeAbove: 0 });
    expect(d).toMatchObject({ time: 0, alreadyAbove: true, timeAbove: 40 });
  });
});

describe('smallest gate opening that keeps the peak below a target (demo storm)', () => {
  const target = 210.5; // dam crest less freeboard
  const r = smallestOpening({ ...base, aboveTable: 'stop' }, { ids: gates, target, start: 12 * H });
  it('finds an opening that works, and one a tolerance smaller does not', () => {
    expect(r.status).toBe('ok');
    const peakAt = (x: number) =>
      routeStorageIndication({ ...base, aboveTable: 'stop', schedule: openAll(x, 12 * H) })
        .peakElevation;
    expect(peakAt(r.opening!)).toBeLessThanOrEqual(target);
    expect(peakAt(r.opening! - 0.011)).toBeGreaterThan(target);
    expect(r.runs).toBeLessThan(20);
  });
  it('reports impossible and not-needed plainly', () => {
    const imp = smallestOpening(
      { ...base, aboveTable: 'stop' },
      { ids: gates, target: 205, start: 12 * H },
    );
    expect(imp.status).toBe('impossible');
    expect(imp.opening).toBeNull();
    expect(imp.message).toContain('even fully open');
    const calm = { ...base, inflow: { t: [0], q: [10] } };
    expect(smallestOpening(calm, { ids: gates, target: 207 }).status).toBe('not-needed');
  });
});

describe('time left to act (demo storm)', () => {
  const plan = openAll(6);
  const target = 210.5;
  const o = { ...base, aboveTable: 'stop' as const };
  const sc = prepareScenario(o);
  const r = latestStart(o, { plan, target }, sc);
  it('the plan started at the latest time keeps the peak down; one step later it does not', () => {
    expect(r.status).toBe('ok');
    expect(r.peakAtLatest!).toBeLessThanOrEqual(target);
    expect(r.peakOneStepLater!).toBeGreaterThan(target);
    const check = (start: number) =>
      routeStorageIndication({ ...o, schedule: plan.map((e) => ({ ...e, time: e.time + start })) })
        .peakElevation;
    expect(check(r.latestStart!)).toBeLessThanOrEqual(target);
    expect(check(r.latestStart! + 60)).toBeGreaterThan(target);
    expect(r.timeLeft).toBe(r.latestStart);
    expect(r.runs).toBeLessThan(20);
  });
  it('counts time left to the step: at the latest start it is 0, one step later it is too late', () => {
    const onTime = latestStart(o, { plan, target, now: r.latestStart! }, sc);
    expect(onTime.status).toBe('ok');
    expect(onTime.timeLeft).toBe(0);
    const oneLate = latestStart(o, { plan, target, now: r.latestStart! + 60 }, sc);
    expect(oneLate.status).toBe('past');
    expect(oneLate.timeLeft).toBe(-60);
  });
  it('says when it is already too late, and by how much', () => {
    const late = latestStart(o, { plan, target, now: r.latestStart! + 2 * H }, sc);
    expect(late.status).toBe('past');
    expect(late.timeLeft).toBe(-2 * H);
    expect(late.peakIfStartedNow).toBeGreaterThan(target);
    expect(late.message).toContain('too late');
  });
  it('says when the plan cannot do it even now, and when no plan is needed', () => {
    expect(latestStart(o, { plan: openAll(0.5), target }, sc).status).toBe('impossible');
    // with the gates shut this storm overtops, so even a target just under the table top needs the plan
    expect(latestStart(o, { plan, target: 213.9 }, sc).status).toBe('ok');
    expect(latestStart({ ...o, inflow: { t: [0], q: [10] } }, { plan, target }).status).toBe(
      'not-needed',
    );
  });
});

describe('compareSchedules', () => {
  it('sets two plans side by side: opening earlier lowers the peak', () => {
    const c = compareSchedules(
      base,
      openAll(4, 12 * H),
      openAll(4, 6 * H),
      DEMO_RESERVOIR.thresholds,
    );
    expect(c.b.peakElevation).toBeLessThan(c.a.peakElevation);
    expect(c.difference.peakElevation).toBeCloseTo(c.b.peakElevation - c.a.peakElevation, 12);
    expect(c.a.thresholds.map((t) => t.id)).toEqual(DEMO_RESERVOIR.thresholds.map((t) => t.id));
    expect(c.b.releasedVolume).toBeGreaterThan(c.a.releasedVolume);
  });
});

describe('release rate-of-change limits', () => {
  const limit = { increase: 0.25, decrease: 0.25 }; // m3/s per s = 15 m3/s per minute
  const o = { ...base, schedule: openAll(6, 12 * H), releaseLimit: limit };
  const r = routeStorageIndication(o);
  it('slow each gate-driven change of release to the limit', () => {
    expect(r.throttled).toBe(true);
    const model = compileOutflow(base.structures);
    const a = new Float64Array(model.controls.length);
    const b = new Float64Array(model.controls.length);
    let worst = 0;
    for (let n = 0; n + 1 < r.time.length; n++) {
      model.controls.forEach((c, k) => {
        a[k] = r.openings[c.id]![n]!;
        b[k] = r.openings[c.id]![n + 1]!;
      });
      const dq = model.outflow(r.elevation[n]!, b, NaN) - model.outflow(r.elevation[n]!, a, NaN);
      worst = Math.max(worst, Math.abs(dq) / 60);
    }
    expect(worst).toBeLessThanOrEqual(0.25 * (1 + 1e-6));
    expect(worst).toBeGreaterThan(0.2);
    expect(routeStorageIndication({ ...o, releaseLimit: undefined }).throttled).toBe(false);
  });
  it('still reaches the target opening, only later', () => {
    const free = routeStorageIndication({ ...o, releaseLimit: undefined });
    const when = (res: typeof r) => res.time[res.openings['gate-1']!.findIndex((x) => x >= 6)]!;
    expect(when(r)).toBeGreaterThan(when(free));
    expect(r.openings['gate-3']![r.time.length - 1]).toBe(6);
  });
});
