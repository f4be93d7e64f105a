import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Gate operation orders and their commands, emergency declarations, automatic rules. */
export class Orders1764892800000 implements MigrationInterface {
  name = 'Orders1764892800000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "orders" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "state" text NOT NULL,
      "emergency" boolean NOT NULL DEFAULT (0),
      "emergency_id" integer,
      "awaiting_countersign" boolean NOT NULL DEFAULT (0),
      "author_id" text NOT NULL,
      "author_name" text NOT NULL,
      "created_at" integer NOT NULL,
      "updated_at" integer NOT NULL,
      "authorised_until" integer,
      "current_step" integer,
      "next_step_due" integer,
      "body" text NOT NULL)`);
    await q.query(`CREATE INDEX "ix_orders_reservoir_state" ON "orders" ("reservoir_id", "state")`);
    await q.query(
      `CREATE INDEX "ix_orders_countersign" ON "orders" ("reservoir_id", "awaiting_countersign")`,
    );
    await q.query(`CREATE TABLE "order_commands" (
      "command_id" text PRIMARY KEY NOT NULL,
      "order_id" integer NOT NULL REFERENCES "orders" ("id"),
      "step" integer NOT NULL,
      "device_id" text NOT NULL,
      "targets" text NOT NULL,
      "from_positions" text NOT NULL,
      "state" text NOT NULL,
      "sent_at" integer,
      "sent_wall" integer,
      "resent" boolean NOT NULL DEFAULT (0),
      "ack_at" integer,
      "reason" text,
      "confirmed_at" integer)`);
    await q.query(`CREATE INDEX "ix_order_commands_order" ON "order_commands" ("order_id")`);
    await q.query(`CREATE TABLE "emergencies" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "level" integer NOT NULL,
      "reason" text NOT NULL,
      "declared_by_id" text NOT NULL,
      "declared_by_name" text NOT NULL,
      "declared_at" integer NOT NULL,
      "ended_by_id" text,
      "ended_by_name" text,
      "ended_at" integer,
      "end_reason" text)`);
    await q.query(
      `CREATE INDEX "ix_emergencies_reservoir" ON "emergencies" ("reservoir_id", "ended_at")`,
    );
    await q.query(`CREATE TABLE "automatic_rules" (
      "reservoir_id" text NOT NULL,
      "control" text NOT NULL,
      "device_id" text NOT NULL,
      "enabled" boolean NOT NULL,
      "rise_above" real NOT NULL,
      "target" real NOT NULL,
      "revision" integer NOT NULL,
      "updated_by_id" text,
      "updated_by_name" text,
      "updated_at" integer,
      "device_state" text NOT NULL,
      "device_detail" text,
      "last_triggered_at" integer,
      PRIMARY KEY ("reservoir_id", "control"))`);
    await q.query(`CREATE TABLE "automation_events" (
      "event_id" text PRIMARY KEY NOT NULL,
      "reservoir_id" text NOT NULL,
      "device_id" text NOT NULL,
      "control" text,
      "kind" text NOT NULL,
      "revision" integer NOT NULL,
      "pool" real,
      "target" real,
      "detail" text,
      "time" integer NOT NULL)`);
    await q.query(
      `CREATE INDEX "ix_automation_events_time" ON "automation_events" ("reservoir_id", "time")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of [
      'automation_events',
      'automatic_rules',
      'emergencies',
      'order_commands',
      'orders',
    ])
      await q.query(`DROP TABLE "${table}"`);
  }
}
