// Hydraulics benchmark (not a test): `node --import tsx bench/run.ts [--json]`.
// Times the engine on Lake Orrin through a storm like the demo storm and compares each figure with a
// bare typed-array loop doing the same arithmetic (bench/bare.ts). Median of repeated runs after warm-up.
import { DEMO_RESERVOIR } from '../src/reservoirs/demo.js';
import {
  createPrng,
  createStorageCurve,
  latestStart,
  memberMultipliers,
  prepareScenario,
  quantileSorted,
  routeStorageIndication,
  runEnsemble,
  sampleSeries,
  type RoutingOptions,
} from '../src/hydraulics/index.js';
import { bareRoute } from './bare.js';

const H = 3600;
const DT = 60;
const STEPS = (72 * H) / DT;
const json = process.argv.includes('--json');

// A storm shaped like the simulator's demo storm: base 30 m3/s, gamma pulses peaking at hours 14 and 30.
function stormAt(hour: number): number {
  const pulse = (start: number, peakHour: number, peak: number, k: number) => {
    if (hour <= start) return 0;
    const x = (hour - start) / (peakHour - start);
    return peak * Math.exp(k * (Math.log(x) + 1 - x));
  };
  return 30 + pulse(4, 14, 40, 3) + pulse(24, 30, 1864, 8);
}
const t = Float64Array.from({ length: STEPS + 1 }, (_, i) => i * DT);
const inflow = { t, q: Float64Array.from(t, (s) => stormAt(s / H)) };
const storage = createStorageCurve(DEMO_RESERVOIR.storageTable);
const gates = ['gate-1', 'gate-2', 'gate-3'];
const valves = { 'low-level-outlet': 10 };
const options: RoutingOptions = {
  storage,
  structures: DEMO_RESERVOIR.structures,
  inflow,
  initialElevation: 204.5,
  initialSettings: { gates: {}, valves },
  schedule: gates.map((id) => ({ time: 12 * H, id, target: 4 })),
  duration: 72 * H,
  dt: DT,
  aboveTable: 'stop',
};

function median(f: () => void, runs: number, warmup = Math.max(3, runs >> 2)): number {
  for (let i = 0; i < warmup; i++) f();
  const ts: number[] = [];
  for (let i = 0; i < runs; i++) {
    const a = performance.now();
    f();
    ts.push(performance.now() - a);
  }
  ts.sort((a, b) => a - b);
  return ts[ts.length >> 1]!;
}

const sampled = sampleSeries(inflow, 0, DT, STEPS);
const elev = new Float64Array(STEPS + 1);
const bareOne = () => bareRoute(storage, sampled, DT, STEPS, 204.5, 12 * H, 4, 10, elev);

// 1. one 72-hour forecast
const forecastMs = median(() => routeStorageIndication(options), 200);
const bareMs = median(bareOne, 200);
const enginePeak = routeStorageIndication(options).peakElevation;
const barePeak = bareOne();
if (Math.abs(enginePeak - barePeak) > 1e-6)
  throw new Error(`bare loop disagrees: ${enginePeak} vs ${barePeak}`);

// 2. a 1,000-member ensemble
const MEMBERS = 1000;
const ensembleMs = median(() => runEnsemble({ ...options, members: MEMBERS, seed: 'bench' }), 5, 1);
const bareEnsemble = () => {
  const prng = createPrng('bench');
  const mult = new Float64Array(STEPS + 1);
  const q = new Float64Array(STEPS + 1);
  const matrix = new Float32Array((STEPS + 1) * MEMBERS);
  const spread = { sigma: 0.3, growth: 12 * H, correlation: 6 * H, interval: 900 };
  for (let k = 0; k < MEMBERS; k++) {
    memberMultipliers(prng, STEPS, DT, spread, mult);
    for (let n = 0; n <= STEPS; n++) q[n] = sampled[n]! * mult[n]!;
    bareRoute(storage, q, DT, STEPS, 204.5, 12 * H, 4, 10, elev);
    for (let n = 0; n <= STEPS; n++) matrix[n * MEMBERS + k] = elev[n]!;
  }
  const col = new Float64Array(MEMBERS);
  const order = Int32Array.from({ length: MEMBERS }, (_, k) => k);
  const out = new Float64Array(3 * (STEPS + 1));
  for (let n = 0; n <= STEPS; n++) {
    // insertion sort in the previous step's rank order, as the engine does
    for (let k = 0; k < MEMBERS; k++) col[k] = matrix[n * MEMBERS + order[k]!]!;
    for (let i = 1; i < MEMBERS; i++) {
      const v = col[i]!;
      const o = order[i]!;
      let j = i - 1;
      while (j >= 0 && col[j]! > v) {
        col[j + 1] = col[j]!;
        order[j + 1] = order[j]!;
        j--;
      }
      col[j + 1] = v;
      order[j + 1] = o;
    }
    out[3 * n] = quantileSorted(col, 0.1);
    out[3 * n + 1] = quantileSorted(col, 0.5);
    out[3 * n + 2] = quantileSorted(col, 0.9);
  }
};
const bareEnsembleMs = median(bareEnsemble, 5, 1);

// 3. "time left to act": latest start of opening all gates to 6 m keeping the peak <= 207.0 m
const plan = gates.map((id) => ({ time: 0, id, target: 6 }));
const noGates = { ...options, schedule: [] };
let runs = 0;
const searchMs = median(() => {
  const r = latestStart(noGates, { plan, target: 207 }, prepareScenario(noGates));
  runs = r.runs;
  if (r.status !== 'ok') throw new Error(`time-left search: ${r.status}`);
}, 20);
const bareSearchMs =
  runs * median(() => bareRoute(storage, sampled, DT, STEPS, 204.5, 20 * H, 6, 10), 100);

const results = [
  {
    name: 'hydraulics: one 72-hour forecast at 60 s steps',
    value: +forecastMs.toFixed(3),
    unit: 'ms',
    target: '<= 2',
    ok: forecastMs <= 2,
    ratio: forecastMs / bareMs,
  },
  {
    name: 'hydraulics: 1,000-member ensemble (72 h, 60 s, p10/p50/p90 every step)',
    value: +ensembleMs.toFixed(1),
    unit: 'ms',
    target: '<= 1000',
    ok: ensembleMs <= 1000,
    ratio: ensembleMs / bareEnsembleMs,
  },
  {
    name: `hydraulics: "time left to act" search (${runs} routings)`,
    value: +searchMs.toFixed(2),
    unit: 'ms',
    target: '<= 200',
    ok: searchMs <= 200,
    ratio: searchMs / bareSearchMs,
  },
  {
    name: 'bare loop: one 72-hour routing of the demo reservoir',
    value: +bareMs.toFixed(3),
    unit: 'ms',
    target: '-',
    ok: true,
  },
];

if (json) console.log(JSON.stringify({ suite: 'hydraulics', results }));
else {
  const w = Math.max(...results.map((r) => r.name.length));
  console.log(
    `${'measure'.padEnd(w)}  ${'result'.padStart(12)}  ${'target'.padStart(8)}  met  ratio to bare`,
  );
  for (const r of results) {
    const ratio = 'ratio' in r && r.ratio !== undefined ? r.ratio.toFixed(2) : '';
    console.log(
      `${r.name.padEnd(w)}  ${`${r.value} ${r.unit}`.padStart(12)}  ${r.target.padStart(8)}  ${r.ok ? 'yes' : 'NO '}  ${ratio}`,
    );
  }
}
