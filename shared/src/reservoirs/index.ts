export * from './definition.js';
export * from './demo.js';
