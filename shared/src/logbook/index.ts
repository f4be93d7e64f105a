export * from './chain.js';
export * from './api.js';
