#!/usr/bin/env node
// `npm run bench`: every benchmark of the repository, gathered into one table in docs/performance.md.
// Each suite prints one JSON line { suite, results: [{ name, value, unit, target, ok, ratio? }] } with --json.
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
// Every gateway/bench/*.ts is a suite of its own, so a new benchmark needs no line here.
const gatewaySuites = readdirSync(join(root, 'gateway/bench'))
  .filter((f) => f.endsWith('.ts') && !f.endsWith('.d.ts'))
  .sort()
  .map((f) => ({ cwd: 'gateway', args: ['--import', 'tsx', `bench/${f}`, '--json'] }));
const SUITES = [
  { cwd: 'shared', args: ['--import', 'tsx', 'bench/run.ts', '--json'] },
  ...gatewaySuites,
];

const rows = [];
for (const suite of SUITES) {
  process.stderr.write(`running ${suite.cwd} benchmarks...\n`);
  const out = execFileSync(process.execPath, suite.args, {
    cwd: join(root, suite.cwd),
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const line = out.split('\n').find((l) => l.startsWith('{"suite"'));
  if (!line) throw new Error(`${suite.cwd}: no JSON result line in:\n${out}`);
  const { suite: name, results } = JSON.parse(line);
  for (const r of results) rows.push({ suite: name, ...r });
}

const cpu = cpus()[0]?.model ?? 'unknown CPU';
const machine = `${cpus().length} cores (${cpu}), ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node.js ${process.version}`;
const date = new Date().toISOString().slice(0, 10);
const fmt = (v) =>
  typeof v === 'number'
    ? Math.abs(v) >= 100
      ? Math.round(v).toLocaleString('en')
      : String(+v.toPrecision(3))
    : String(v);
const table = [
  '| suite | measure | result | target | met | ratio to bare loop/insert |',
  '|---|---|---|---|---|---|',
  ...rows.map(
    (r) =>
      `| ${r.suite} | ${r.name} | ${fmt(r.value)} ${r.unit} | ${r.target} | ${r.ok ? 'yes' : '**no**'} | ${r.ratio === undefined ? '' : fmt(r.ratio)} |`,
  ),
].join('\n');
console.log(`${machine}, ${date}\n\n${table}`);

const file = join(root, 'docs/performance.md');
const begin = '<!-- bench:begin -->';
const end = '<!-- bench:end -->';
const doc = readFileSync(file, 'utf8');
const i = doc.indexOf(begin);
const j = doc.indexOf(end);
if (i < 0 || j < 0) throw new Error('docs/performance.md lacks the bench markers');
writeFileSync(
  file,
  `${doc.slice(0, i + begin.length)}\nLast run: ${date}, on ${machine}.\n\n${table}\n${doc.slice(j)}`,
);
if (rows.some((r) => !r.ok)) process.stderr.write('Some targets were missed; see the table.\n');
