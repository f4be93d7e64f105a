import { InitialSchema1764633600000 } from './1764633600000-initial-schema';
import { Logbook1764633700000 } from './1764633700000-logbook';

/** In order; TypeORM runs the ones not yet applied at start. */
export const MIGRATIONS = [InitialSchema1764633600000, Logbook1764633700000];
