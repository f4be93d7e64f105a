export * from './actions.js';
export * from './api.js';
export * from './errors.js';
export * from './live.js';
export * from './password.js';
export * from './permissions.js';
export * from './roles.js';
