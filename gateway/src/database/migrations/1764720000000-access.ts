import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Accounts, sessions and refresh-token families (sign-in, roles and access control). */
export class Access1764720000000 implements MigrationInterface {
  name = 'Access1764720000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "users" (
      "id" text PRIMARY KEY NOT NULL,
      "username" text NOT NULL,
      "display_name" text NOT NULL,
      "roles" text NOT NULL,
      "password_hash" text NOT NULL,
      "password_changed_at" integer NOT NULL,
      "must_change_password" boolean NOT NULL DEFAULT (0),
      "disabled_at" integer,
      "totp_secret" text,
      "totp_pending_secret" text,
      "totp_last_step" integer,
      "created_at" integer NOT NULL,
      "updated_at" integer NOT NULL)`);
    await q.query(`CREATE UNIQUE INDEX "ux_users_username" ON "users" ("username")`);
    await q.query(`CREATE TABLE "sessions" (
      "id" text PRIMARY KEY NOT NULL,
      "user_id" text NOT NULL REFERENCES "users" ("id"),
      "created_at" integer NOT NULL,
      "last_refreshed_at" integer NOT NULL,
      "expires_at" integer NOT NULL,
      "stepped_up_at" integer,
      "revoked_at" integer,
      "revoked_reason" text,
      "user_agent" text,
      "ip" text)`);
    await q.query(`CREATE INDEX "ix_sessions_user" ON "sessions" ("user_id")`);
    await q.query(`CREATE TABLE "refresh_tokens" (
      "token_hash" text PRIMARY KEY NOT NULL,
      "session_id" text NOT NULL REFERENCES "sessions" ("id") ON DELETE CASCADE,
      "issued_at" integer NOT NULL,
      "used_at" integer)`);
    await q.query(`CREATE INDEX "ix_refresh_tokens_session" ON "refresh_tokens" ("session_id")`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['refresh_tokens', 'sessions', 'users'])
      await q.query(`DROP TABLE "${table}"`);
  }
}
