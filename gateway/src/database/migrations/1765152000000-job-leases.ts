import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Who runs each scheduled job when several gateways share one database (portable SQL). */
export class JobLeases1765152000000 implements MigrationInterface {
  name = 'JobLeases1765152000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "job_leases" (
      "job" text PRIMARY KEY NOT NULL,
      "holder" text NOT NULL,
      "expires_at" bigint NOT NULL)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "job_leases"`);
  }
}
