export * from './api.js';
export * from './backfill.js';
export * from './message.js';
export * from './downsample.js';
export * from './series.js';
export * from './topics.js';
export * from './validation.js';
