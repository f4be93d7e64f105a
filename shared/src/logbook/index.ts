export * from './chain.js';
export * from './api.js';
export * from './attachments.js';
export * from './shift-log.js';
