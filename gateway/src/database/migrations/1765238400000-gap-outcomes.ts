import type { MigrationInterface, QueryRunner } from 'typeorm';

/** What became of each sequence gap: asked for again, filled, or unavailable and why (portable SQL). */
export class GapOutcomes1765238400000 implements MigrationInterface {
  name = 'GapOutcomes1765238400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "sequence_gaps" ADD COLUMN "state" text NOT NULL DEFAULT 'open'`);
    await q.query(`ALTER TABLE "sequence_gaps" ADD COLUMN "attempts" integer NOT NULL DEFAULT 0`);
    await q.query(`ALTER TABLE "sequence_gaps" ADD COLUMN "detail" text`);
    await q.query(`ALTER TABLE "sequence_gaps" ADD COLUMN "resolved_at" integer`);
    // gaps recorded before the gateway could ask are not chased at the first start after this
    await q.query(
      `UPDATE "sequence_gaps" SET "state" = 'unanswered', "detail" = 'recorded before backfill requests'`,
    );
    await q.query(`CREATE INDEX "ix_gaps_state" ON "sequence_gaps" ("state")`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "ix_gaps_state"`);
    for (const column of ['resolved_at', 'detail', 'attempts', 'state'])
      await q.query(`ALTER TABLE "sequence_gaps" DROP COLUMN "${column}"`);
  }
}
