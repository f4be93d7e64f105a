import { InitialSchema1764633600000 } from './1764633600000-initial-schema';
import { Logbook1764633700000 } from './1764633700000-logbook';
import { Alarms1764640000000 } from './1764640000000-alarms';
import { Access1764720000000 } from './1764720000000-access';
import { Notices1764650000000 } from './1764650000000-notices';
import { Forecasts1764806400000 } from './1764806400000-forecasts';
import { Orders1764892800000 } from './1764892800000-orders';
import { Retention1765065600000 } from './1765065600000-retention';
import { JobLeases1765152000000 } from './1765152000000-job-leases';
import { GapOutcomes1765238400000 } from './1765238400000-gap-outcomes';

/** In order; TypeORM runs the ones not yet applied at start. */
export const MIGRATIONS = [
  InitialSchema1764633600000,
  Logbook1764633700000,
  Access1764720000000,
  Notices1764650000000,
  Alarms1764640000000,
  Forecasts1764806400000,
  Orders1764892800000,
  Retention1765065600000,
  JobLeases1765152000000,
  GapOutcomes1765238400000,
];
