import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * One-minute aggregates of the readings, kept for ever, and the retention jobs' marks. Portable
 * SQL (SQLite and PostgreSQL): bigint for epoch ms, double precision for values, no AUTOINCREMENT.
 */
export class Retention1765065600000 implements MigrationInterface {
  name = 'Retention1765065600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "reading_aggregates" (
      "reservoir_id" text NOT NULL,
      "channel" text NOT NULL,
      "minute" bigint NOT NULL,
      "count" integer NOT NULL,
      "min" double precision,
      "min_time" bigint,
      "max" double precision,
      "max_time" bigint,
      "mean" double precision,
      "suspect_count" integer NOT NULL,
      "bad_count" integer NOT NULL,
      "first_received_at" bigint NOT NULL,
      PRIMARY KEY ("reservoir_id", "channel", "minute"))`);
    // the same, rolled up per hour (from the minute aggregates), for long windows
    await q.query(`CREATE TABLE "reading_hour_aggregates" (
      "reservoir_id" text NOT NULL,
      "channel" text NOT NULL,
      "hour" bigint NOT NULL,
      "count" integer NOT NULL,
      "min" double precision,
      "min_time" bigint,
      "max" double precision,
      "max_time" bigint,
      "mean" double precision,
      "suspect_count" integer NOT NULL,
      "bad_count" integer NOT NULL,
      "first_received_at" bigint NOT NULL,
      PRIMARY KEY ("reservoir_id", "channel", "hour"))`);
    await q.query(`CREATE TABLE "retention_marks" (
      "reservoir_id" text PRIMARY KEY NOT NULL,
      "aggregated_through" bigint NOT NULL,
      "pruned_through" bigint NOT NULL)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "retention_marks"`);
    await q.query(`DROP TABLE "reading_hour_aggregates"`);
    await q.query(`DROP TABLE "reading_aggregates"`);
  }
}
