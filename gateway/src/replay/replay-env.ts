import { z } from 'zod';

/** Replay limits (docs/replay.md). */
export const replayEnv = {
  /** a window expected to hold more raw readings than this is served from minute aggregates */
  REPLAY_RAW_MAX_ROWS: z.coerce.number().int().min(1000).max(10_000_000).default(100_000),
  /** a window needing more minute aggregates than this (minutes x channels) uses hourly roll-ups */
  REPLAY_MINUTE_MAX_ROWS: z.coerce.number().int().min(1000).max(10_000_000).default(50_000),
  /** the longest window one request may ask for, days */
  REPLAY_MAX_WINDOW_DAYS: z.coerce.number().positive().max(3650).default(31),
};
