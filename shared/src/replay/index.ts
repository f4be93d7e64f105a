export * from './api.js';
export * from './alarm-fold.js';
