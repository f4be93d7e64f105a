import type { CompareResponse, WhatIfResponse } from '@stillwell/shared/forecasts';
import { RES, startForecastPlant, type ForecastPlant } from './support/forecast-plant';

const base = `/api/reservoirs/${RES}/forecasts`;
const H = 3600;
/** A flood rising to 1,900 m3/s at hour 6, back to 300 at hour 24. */
const flood = [
  { t: 0, q: 300 },
  { t: 6 * H, q: 1900 },
  { t: 24 * H, q: 300 },
];
const gates = ['gate-1', 'gate-2', 'gate-3'];
const openAll = (time: number, target = 6) => gates.map((id) => ({ time, id, target }));

describe('what-if and compare, through the API', () => {
  let plant: ForecastPlant;
  const post = (path: string, body: object) => plant.api.post(`${base}/${path}`).send(body);

  beforeAll(async () => {
    plant = await startForecastPlant();
  });

  afterAll(async () => {
    await plant?.close();
  });

  it('routes a hydrograph: with the gates opened the peak is lower than with them shut', async () => {
    const start = { inflow: flood, startElevation: 205, initialOpenings: [] };
    const shut = (await post('what-if', { ...start, schedule: [] }).expect(200))
      .body as WhatIfResponse;
    const open = (await post('what-if', { ...start, schedule: openAll(0) }).expect(200))
      .body as WhatIfResponse;
    expect(open.summary.peakElevation).toBeLessThan(shut.summary.peakElevation - 1);
    expect(shut.summary.peakOutflow).toBeLessThan(open.summary.peakOutflow);
    expect(shut.durationS).toBe(24 * H);
    expect(shut.series.t[0]).toBe(0);
    expect(shut.series.t.at(-1)).toBe(24 * H);
    expect(shut.series.elevation[0]).toBe(205);
    expect(shut.definitionVersion).toBe(1);
    expect(shut.caution).toMatch(/Decision support/);
    const dam = shut.summary.thresholds.find((t) => t.id === 'aux-spillway')!;
    expect(dam.timeS).toBeGreaterThan(0);
    expect(dam.timeAboveS).toBeGreaterThan(0);
  });

  it('compares "open now" with "open in 3 hours" side by side', async () => {
    const res = await post('compare', {
      inflow: flood,
      startElevation: 205,
      initialOpenings: [],
      labelA: 'Open now',
      scheduleA: openAll(0),
      labelB: 'Open in 3 hours',
      scheduleB: openAll(3 * H),
    }).expect(200);
    const c = res.body as CompareResponse;
    expect(c.a.label).toBe('Open now');
    expect(c.b.summary.peakElevation).toBeGreaterThan(c.a.summary.peakElevation);
    expect(c.difference.peakElevation).toBeCloseTo(
      c.b.summary.peakElevation - c.a.summary.peakElevation,
      9,
    );
    expect(c.a.summary.thresholds.map((t) => t.id)).toEqual(
      c.b.summary.thresholds.map((t) => t.id),
    );
  });

  it('takes the hydrograph as CSV text, in hours', async () => {
    const res = await post('what-if', {
      inflowCsv: 'hour,flow\n0,300\n6,1900\n24,300\n',
      inflowTimeUnit: 'h',
      startElevation: 205,
      schedule: [],
    }).expect(200);
    const rows = await post('what-if', { inflow: flood, startElevation: 205, schedule: [] }).expect(
      200,
    );
    expect(res.body.summary.peakElevation).toBeCloseTo(rows.body.summary.peakElevation, 9);
  });

  it('answers bad tables with a 400 that names the field, the row and the column', async () => {
    const messages = async (body: object, path = 'what-if') =>
      ((await post(path, body).expect(400)).body.message as string[]).join('\n');
    expect(
      await messages({
        inflow: [
          { t: 0, q: 300 },
          { t: 3600, q: 800 },
          { t: 3600, q: 900 },
          { t: 7200, q: -4 },
        ],
        startElevation: 205,
        schedule: [],
      }),
    ).toContain(
      'inflow row 3 (t): must be after row 2 (3600 s); inflow row 4 (q): must not be negative (-4 m3/s)',
    );
    expect(
      await messages({
        inflowCsv: 'time,flow\n0,300\n3600,abc\n',
        startElevation: 205,
        schedule: [],
      }),
    ).toContain(`inflowCsv row 3, column 'flow': not a number ("abc")`);
    expect(
      await messages({
        inflow: flood,
        startElevation: 205,
        schedule: [{ time: 0, id: 'gate-9', target: 2 }],
      }),
    ).toContain('schedule row 1 (id): no gate or valve "gate-9"');
    expect(
      await messages({
        inflow: flood,
        startElevation: 205,
        schedule: [{ time: 0, id: 'gate-1', target: 12 }],
      }),
    ).toContain('schedule row 1 (target): 12 m is above the largest opening 9 m');
    expect(
      await messages({
        inflow: flood,
        startElevation: 205,
        schedule: [{ time: 'now', id: 'gate-1', target: 1 }],
      }),
    ).toContain('schedule row 1 (time): must be a finite number ("now")');
    expect(
      await messages(
        {
          inflow: flood,
          startElevation: 205,
          labelA: 'a',
          scheduleA: [],
          labelB: 'b',
          scheduleB: [{ time: 0, id: 'low-level-outlet', target: 150 }],
        },
        'compare',
      ),
    ).toContain('scheduleB row 1 (target): 150 % is above the largest opening 100 %');
    expect(await messages({ startElevation: 205, schedule: [] })).toContain(
      'inflow: give the hydrograph',
    );
    expect(await messages({ inflow: flood, startElevation: 300, schedule: [] })).toContain(
      'startElevation: 300 m is outside the storage table (171 to 217 m)',
    );
    expect(
      await messages({ inflow: flood, startElevation: 205, schedule: [], extra: 1 }),
    ).toContain('property extra should not exist');
  });

  it('needs a start elevation when no pool gauge reports', async () => {
    const res = await post('what-if', { inflow: flood, schedule: [] }).expect(400);
    expect(res.body.message).toEqual([
      'startElevation: give one: there is no usable pool reading now',
    ]);
  });
});
