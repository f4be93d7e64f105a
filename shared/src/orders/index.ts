export * from './api.js';
export * from './automation.js';
export * from './controls.js';
export * from './impact.js';
export * from './interlocks.js';
export * from './release.js';
export * from './rules.js';
export * from './states.js';
