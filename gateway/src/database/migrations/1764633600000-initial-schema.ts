import type { MigrationInterface, QueryRunner } from 'typeorm';

export class InitialSchema1764633600000 implements MigrationInterface {
  name = 'InitialSchema1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "reservoirs" (
      "id" text PRIMARY KEY NOT NULL,
      "name" text NOT NULL,
      "dam_name" text NOT NULL,
      "time_zone" text NOT NULL,
      "current_version" integer NOT NULL)`);
    await q.query(`CREATE TABLE "reservoir_versions" (
      "reservoir_id" text NOT NULL,
      "version" integer NOT NULL,
      "definition" text NOT NULL,
      "created_at" integer NOT NULL,
      "created_by" text NOT NULL,
      PRIMARY KEY ("reservoir_id", "version"))`);
    await q.query(`CREATE TABLE "readings" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "device_id" text NOT NULL,
      "channel" text NOT NULL,
      "seq" integer NOT NULL,
      "time" integer NOT NULL,
      "value" real NOT NULL,
      "quality" text NOT NULL,
      "received_at" integer NOT NULL)`);
    await q.query(
      `CREATE UNIQUE INDEX "ux_readings_device_seq" ON "readings" ("reservoir_id", "device_id", "seq", "time")`,
    );
    await q.query(
      `CREATE INDEX "ix_readings_channel_time" ON "readings" ("reservoir_id", "channel", "time")`,
    );
    await q.query(`CREATE TABLE "quarantined_messages" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "received_at" integer NOT NULL,
      "topic" text NOT NULL,
      "reservoir_id" text,
      "reason" text NOT NULL,
      "detail" text NOT NULL,
      "payload" text NOT NULL,
      "payload_bytes" integer NOT NULL)`);
    await q.query(
      `CREATE INDEX "ix_quarantine_received" ON "quarantined_messages" ("received_at")`,
    );
    await q.query(`CREATE TABLE "sequence_gaps" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "device_id" text NOT NULL,
      "from_seq" integer NOT NULL,
      "to_seq" integer NOT NULL,
      "detected_at" integer NOT NULL)`);
    await q.query(`CREATE INDEX "ix_gaps_device" ON "sequence_gaps" ("reservoir_id", "device_id")`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of [
      'sequence_gaps',
      'quarantined_messages',
      'readings',
      'reservoir_versions',
      'reservoirs',
    ]) {
      await q.query(`DROP TABLE "${table}"`);
    }
  }
}
