import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/**
 * One refresh token of a session, stored as its SHA-256 (the token is 256 random bits, so a slow
 * hash adds nothing). A used token stays: presenting it again is reuse and ends the family.
 */
@Entity('refresh_tokens')
@Index('ix_refresh_tokens_session', ['sessionId'])
export class RefreshTokenRow {
  @PrimaryColumn('text', { name: 'token_hash' })
  tokenHash: string;

  @Column('text', { name: 'session_id' })
  sessionId: string;

  @Column('integer', { name: 'issued_at' })
  issuedAt: number;

  @Column('integer', { name: 'used_at', nullable: true })
  usedAt: number | null;
}
