export * from './configuration';
