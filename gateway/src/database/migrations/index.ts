import { InitialSchema1764633600000 } from './1764633600000-initial-schema';
import { Logbook1764633700000 } from './1764633700000-logbook';
import { Access1764720000000 } from './1764720000000-access';

/** In order; TypeORM runs the ones not yet applied at start. */
export const MIGRATIONS = [InitialSchema1764633600000, Logbook1764633700000, Access1764720000000];
