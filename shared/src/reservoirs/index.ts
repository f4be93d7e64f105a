export * from './api.js';
export * from './definition.js';
export * from './demo.js';
