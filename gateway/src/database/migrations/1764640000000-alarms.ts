import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Alarms: each condition's present state (one row per reservoir and condition) and the history
 * of every raise, clear and handling action. Times are site time (plant time in the demo), since
 * on-delays, shelf expiries and alarm rates run on it; wall time is kept beside for the record.
 */
export class Alarms1764640000000 implements MigrationInterface {
  name = 'Alarms1764640000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "alarms" (
      "reservoir_id" text NOT NULL,
      "condition_id" text NOT NULL,
      "kind" text NOT NULL,
      "label" text NOT NULL,
      "priority" text NOT NULL,
      "active" boolean NOT NULL DEFAULT (0),
      "acknowledged" boolean NOT NULL DEFAULT (1),
      "handling" text NOT NULL DEFAULT ('in-service'),
      "shelved_until" integer,
      "reason" text,
      "handled_by" text,
      "raised_at" integer,
      "cleared_at" integer,
      "acknowledged_at" integer,
      "acknowledged_by" text,
      "value" real,
      "limit_value" real,
      "message" text NOT NULL DEFAULT (''),
      "last_change" integer NOT NULL,
      "activations" integer NOT NULL DEFAULT (0),
      PRIMARY KEY ("reservoir_id", "condition_id"))`);
    await q.query(`CREATE TABLE "alarm_events" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "condition_id" text NOT NULL,
      "kind" text NOT NULL,
      "site_time" integer NOT NULL,
      "wall_time" integer NOT NULL,
      "priority" text NOT NULL,
      "annunciated" boolean NOT NULL DEFAULT (0),
      "actor_id" text,
      "actor_name" text,
      "text" text,
      "value" real,
      "logbook_seq" integer)`);
    await q.query(
      `CREATE INDEX "ix_alarm_events_condition" ON "alarm_events" ("reservoir_id", "condition_id", "site_time")`,
    );
    await q.query(
      `CREATE INDEX "ix_alarm_events_time" ON "alarm_events" ("reservoir_id", "site_time")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "alarm_events"`);
    await q.query(`DROP TABLE "alarms"`);
  }
}
