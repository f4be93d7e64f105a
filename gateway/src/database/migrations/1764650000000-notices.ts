import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Downstream notices: zones below the dam, the people to tell in each, the notices prepared for a
 * release (one per order and zone) and each message to each person. Times are epoch ms of the
 * site clock (plant time in the demo), because lead times and escalation windows run on it.
 */
export class Notices1764650000000 implements MigrationInterface {
  name = 'Notices1764650000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "downstream_zones" (
      "id" text PRIMARY KEY NOT NULL,
      "reservoir_id" text NOT NULL,
      "name" text NOT NULL,
      "kind" text NOT NULL,
      "distance_m" real NOT NULL,
      "affected_at_m3s" real NOT NULL,
      "travel_times" text NOT NULL,
      "created_at" integer NOT NULL,
      "updated_at" integer NOT NULL)`);
    await q.query(
      `CREATE UNIQUE INDEX "ux_downstream_zones_name" ON "downstream_zones" ("reservoir_id", "name")`,
    );
    await q.query(`CREATE TABLE "downstream_contacts" (
      "id" text PRIMARY KEY NOT NULL,
      "zone_id" text NOT NULL REFERENCES "downstream_zones" ("id"),
      "organisation" text NOT NULL,
      "person" text NOT NULL,
      "role" text NOT NULL,
      "email" text NOT NULL,
      "phone" text NOT NULL,
      "lead_time_s" integer NOT NULL,
      "escalation_order" integer NOT NULL,
      "ack_window_s" integer NOT NULL,
      "user_id" text,
      "active" boolean NOT NULL,
      "created_at" integer NOT NULL,
      "updated_at" integer NOT NULL)`);
    await q.query(
      `CREATE INDEX "ix_downstream_contacts_zone" ON "downstream_contacts" ("zone_id")`,
    );
    await q.query(
      `CREATE INDEX "ix_downstream_contacts_user" ON "downstream_contacts" ("user_id")`,
    );
    await q.query(`CREATE TABLE "release_notices" (
      "id" text PRIMARY KEY NOT NULL,
      "reservoir_id" text NOT NULL,
      "order_id" text NOT NULL,
      "zone_id" text NOT NULL REFERENCES "downstream_zones" ("id"),
      "state" text NOT NULL,
      "emergency" boolean NOT NULL DEFAULT (0),
      "release_m3s" real NOT NULL,
      "previous_release_m3s" real,
      "planned_start_at" integer,
      "start_at" integer NOT NULL,
      "arrival_at" integer NOT NULL,
      "duration_s" integer,
      "travel_time_s" integer NOT NULL,
      "beyond_table" text,
      "subject" text NOT NULL,
      "template" text NOT NULL,
      "prepared_at" integer NOT NULL,
      "sent_at" integer,
      "sent_by" text,
      "updated_at" integer NOT NULL)`);
    await q.query(
      `CREATE UNIQUE INDEX "ux_release_notices_order_zone" ON "release_notices" ("order_id", "zone_id")`,
    );
    await q.query(
      `CREATE INDEX "ix_release_notices_state" ON "release_notices" ("reservoir_id", "state")`,
    );
    await q.query(`CREATE TABLE "notice_recipients" (
      "id" text PRIMARY KEY NOT NULL,
      "notice_id" text NOT NULL REFERENCES "release_notices" ("id"),
      "contact_id" text NOT NULL REFERENCES "downstream_contacts" ("id"),
      "chain_level" integer NOT NULL,
      "reason" text NOT NULL,
      "lead_time_s" integer NOT NULL,
      "ack_window_s" integer NOT NULL,
      "delivery" text NOT NULL,
      "sent_at" integer,
      "delivered_at" integer,
      "bounced_at" integer,
      "bounce_reason" text,
      "message_id" text,
      "acknowledged_at" integer,
      "acknowledged_via" text,
      "escalated_at" integer)`);
    await q.query(
      `CREATE UNIQUE INDEX "ux_notice_recipients_contact" ON "notice_recipients" ("notice_id", "contact_id")`,
    );
    await q.query(`CREATE TABLE "demo_outbox" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "received_at" integer NOT NULL,
      "envelope_from" text NOT NULL,
      "envelope_to" text NOT NULL,
      "subject" text NOT NULL,
      "raw" text NOT NULL)`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of [
      'demo_outbox',
      'notice_recipients',
      'release_notices',
      'downstream_contacts',
      'downstream_zones',
    ])
      await q.query(`DROP TABLE "${table}"`);
  }
}
