// The shared package type-checks without Node's types (it is pure); the benchmark runs on Node and
// uses only these three globals.
declare const process: { argv: string[] };
declare const performance: { now(): number };
declare const console: { log(...values: unknown[]): void };
