export * from './api.js';
export * from './definition.js';
export * from './demo.js';
export * from './limits-change.js';
