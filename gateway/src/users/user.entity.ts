import { Column, Entity, PrimaryColumn } from 'typeorm';

/** An account. Times are epoch ms (UTC). */
@Entity('users')
export class UserRow {
  @PrimaryColumn('text')
  id: string;

  /** lower-case; unique */
  @Column('text')
  username: string;

  @Column('text', { name: 'display_name' })
  displayName: string;

  /** JSON array of role names */
  @Column('text')
  roles: string;

  /** scrypt$N$r$p$salt$hash (base64): the parameters travel with the hash so they can be raised */
  @Column('text', { name: 'password_hash' })
  passwordHash: string;

  @Column('integer', { name: 'password_changed_at' })
  passwordChangedAt: number;

  /** set by an administrator's reset: the temporary password must be replaced */
  @Column('boolean', { name: 'must_change_password' })
  mustChangePassword: boolean;

  @Column('integer', { name: 'disabled_at', nullable: true })
  disabledAt: number | null;

  /** base32 TOTP key once confirmed */
  @Column('text', { name: 'totp_secret', nullable: true })
  totpSecret: string | null;

  /** base32 TOTP key between begin and confirm */
  @Column('text', { name: 'totp_pending_secret', nullable: true })
  totpPendingSecret: string | null;

  /** the last 30-second step a code was accepted for: a code is good once (RFC 6238 5.2) */
  @Column('integer', { name: 'totp_last_step', nullable: true })
  totpLastStep: number | null;

  @Column('integer', { name: 'created_at' })
  createdAt: number;

  @Column('integer', { name: 'updated_at' })
  updatedAt: number;
}
