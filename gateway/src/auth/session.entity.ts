import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * A signed-in session: one family of refresh tokens, from sign-in to sign-out, revocation or
 * expiry. Every access token names its session, and the guard checks it on each request.
 */
@Entity('sessions')
@Index('ix_sessions_user', ['userId'])
export class SessionRow {
  @PrimaryColumn('text')
  id: string;

  @Column('text', { name: 'user_id' })
  userId: string;

  @Column('integer', { name: 'created_at' })
  createdAt: number;

  @Column('integer', { name: 'last_refreshed_at' })
  lastRefreshedAt: number;

  /** absolute end, whatever the refreshes */
  @Column('integer', { name: 'expires_at' })
  expiresAt: number;

  /** the last time the password (and second factor) was given again in this session */
  @Column('integer', { name: 'stepped_up_at', nullable: true })
  steppedUpAt: number | null;

  @Column('integer', { name: 'revoked_at', nullable: true })
  revokedAt: number | null;

  @Column('text', { name: 'revoked_reason', nullable: true })
  revokedReason: string | null;

  @Column('text', { name: 'user_agent', nullable: true })
  userAgent: string | null;

  @Column('text', { nullable: true })
  ip: string | null;
}
