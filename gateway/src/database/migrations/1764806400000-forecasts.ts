import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Stored forecast runs (append-only), and what each reservoir definition version changed. */
export class Forecasts1764806400000 implements MigrationInterface {
  name = 'Forecasts1764806400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "forecast_runs" (
      "id" integer PRIMARY KEY AUTOINCREMENT NOT NULL,
      "reservoir_id" text NOT NULL,
      "computed_at" integer NOT NULL,
      "stored_at" integer NOT NULL,
      "trigger" text NOT NULL,
      "trigger_detail" text NOT NULL,
      "definition_version" integer NOT NULL,
      "code_version" text NOT NULL,
      "start_elevation" real NOT NULL,
      "peak_elevation" real NOT NULL,
      "peak_time" integer NOT NULL,
      "peak_p90" real NOT NULL,
      "time_left_status" text NOT NULL,
      "latest_start" integer,
      "inputs" text NOT NULL,
      "outputs" text NOT NULL,
      "decisions" text NOT NULL)`);
    await q.query(
      `CREATE INDEX "ix_forecast_runs_time" ON "forecast_runs" ("reservoir_id", "computed_at")`,
    );
    // What operators were shown is evidence: ordinary SQL cannot rewrite or remove it.
    await q.query(`CREATE TRIGGER "forecast_runs_no_update" BEFORE UPDATE ON "forecast_runs"
      BEGIN SELECT RAISE(ABORT, 'forecast runs are append-only: UPDATE refused'); END`);
    await q.query(`CREATE TRIGGER "forecast_runs_no_delete" BEFORE DELETE ON "forecast_runs"
      BEGIN SELECT RAISE(ABORT, 'forecast runs are append-only: DELETE refused'); END`);
    // Which part of the definition a version changed, and the uploader's note.
    await q.query(`ALTER TABLE "reservoir_versions" ADD COLUMN "change" text`);
    await q.query(`ALTER TABLE "reservoir_versions" ADD COLUMN "note" text`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "reservoir_versions" DROP COLUMN "note"`);
    await q.query(`ALTER TABLE "reservoir_versions" DROP COLUMN "change"`);
    await q.query(`DROP TRIGGER "forecast_runs_no_delete"`);
    await q.query(`DROP TRIGGER "forecast_runs_no_update"`);
    await q.query(`DROP TABLE "forecast_runs"`);
  }
}
