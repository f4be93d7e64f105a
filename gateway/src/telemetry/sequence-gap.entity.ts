import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * open: asked for (or about to be); filled: every reading of the run is stored; unavailable: the
 * device answered that some are gone (detail says which and why); unanswered: no answer after the
 * last attempt.
 */
export const GAP_STATES = ['open', 'filled', 'unavailable', 'unanswered'] as const;
export type GapState = (typeof GAP_STATES)[number];

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

  @Column('text', { default: 'open' })
  state: GapState;

  /** backfill requests sent for it */
  @Column('integer', { default: 0 })
  attempts: number;

  /** the device's reasons for what it could not send, e.g. "overrun 10-19" */
  @Column('text', { nullable: true })
  detail: string | null;

  @Column('integer', { name: 'resolved_at', nullable: true })
  resolvedAt: number | null;
}

/** What ingestion records when it sees a gap; the outcome columns take their defaults. */
export type NewSequenceGap = Pick<
  SequenceGap,
  'reservoirId' | 'deviceId' | 'fromSeq' | 'toSeq' | 'detectedAt'
>;
