import { InitialSchema1764633600000 } from './1764633600000-initial-schema';

/** In order; TypeORM runs the ones not yet applied at start. */
export const MIGRATIONS = [InitialSchema1764633600000];
