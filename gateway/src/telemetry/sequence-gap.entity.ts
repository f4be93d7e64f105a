import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A run of sequence numbers a device skipped: messages that never arrived (yet). */
@Entity('sequence_gaps')
@Index('ix_gaps_device', ['reservoirId', 'deviceId'])
export class SequenceGap {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text', { name: 'device_id' })
  deviceId: string;

  /** first missing sequence number */
  @Column('integer', { name: 'from_seq' })
  fromSeq: number;

  /** last missing sequence number */
  @Column('integer', { name: 'to_seq' })
  toSeq: number;

  @Column('integer', { name: 'detected_at' })
  detectedAt: number;
}
