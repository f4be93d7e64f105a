export * from './api.js';
export * from './tables.js';
export * from './what-if.js';
