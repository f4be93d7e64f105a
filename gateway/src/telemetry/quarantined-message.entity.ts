import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A message that failed validation, kept with its reason and raw payload for inspection. */
@Entity('quarantined_messages')
@Index('ix_quarantine_received', ['receivedAt'])
export class QuarantinedMessage {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('integer', { name: 'received_at' })
  receivedAt: number;

  @Column('text')
  topic: string;

  @Column('text', { name: 'reservoir_id', nullable: true })
  reservoirId: string | null;

  @Column('text')
  reason: string;

  @Column('text')
  detail: string;

  /** raw payload as received (UTF-8, invalid bytes replaced), cut at PAYLOAD_KEEP_BYTES */
  @Column('text')
  payload: string;

  @Column('integer', { name: 'payload_bytes' })
  payloadBytes: number;
}
