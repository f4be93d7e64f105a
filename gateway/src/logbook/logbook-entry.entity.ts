import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** One logbook entry. Append-only: SQLite triggers refuse UPDATE and DELETE on this table. */
@Entity('logbook_entries')
@Index('ix_logbook_kind_time', ['kind', 'time'])
@Index('ix_logbook_actor', ['actorName'])
export class LogbookEntryRow {
  @PrimaryColumn('integer')
  seq: number;

  /** ISO 8601 UTC with milliseconds: exactly the text that was hashed */
  @Column('text')
  time: string;

  @Column('text', { name: 'actor_id', nullable: true })
  actorId: string | null;

  @Column('text', { name: 'actor_name', nullable: true })
  actorName: string | null;

  /** JSON array of role names */
  @Column('text', { name: 'actor_roles' })
  actorRoles: string;

  @Column('text')
  kind: string;

  /** the payload as RFC 8785 canonical JSON */
  @Column('text')
  payload: string;

  @Column('text', { name: 'prev_hash' })
  prevHash: string;

  @Column('text')
  hash: string;
}
