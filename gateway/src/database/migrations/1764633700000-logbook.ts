import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Logbook1764633700000 implements MigrationInterface {
  name = 'Logbook1764633700000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "logbook_entries" (
      "seq" integer PRIMARY KEY NOT NULL,
      "time" text NOT NULL,
      "actor_id" text,
      "actor_name" text,
      "actor_roles" text NOT NULL,
      "kind" text NOT NULL,
      "payload" text NOT NULL,
      "prev_hash" text NOT NULL,
      "hash" text NOT NULL)`);
    await q.query(`CREATE INDEX "ix_logbook_kind_time" ON "logbook_entries" ("kind", "time")`);
    await q.query(`CREATE INDEX "ix_logbook_actor" ON "logbook_entries" ("actor_name")`);
    // The chain makes a change detectable; the triggers make it impossible through ordinary SQL.
    await q.query(`CREATE TRIGGER "logbook_no_update" BEFORE UPDATE ON "logbook_entries"
      BEGIN SELECT RAISE(ABORT, 'logbook entries are append-only: UPDATE refused'); END`);
    await q.query(`CREATE TRIGGER "logbook_no_delete" BEFORE DELETE ON "logbook_entries"
      BEGIN SELECT RAISE(ABORT, 'logbook entries are append-only: DELETE refused'); END`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER "logbook_no_delete"`);
    await q.query(`DROP TRIGGER "logbook_no_update"`);
    await q.query(`DROP TABLE "logbook_entries"`);
  }
}
