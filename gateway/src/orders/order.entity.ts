import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A gate operation order as it stands now. The columns are what is searched on; `body` holds the
 * rest as JSON (steps, reason, forecast, impact, the signatures). Its history is in the logbook:
 * every change of this row is written in the same transaction as the entry that records it.
 */
@Entity('orders')
@Index('ix_orders_reservoir_state', ['reservoirId', 'state'])
export class OrderRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text')
  state: string;

  @Column('boolean')
  emergency: boolean;

  @Column('integer', { name: 'emergency_id', nullable: true })
  emergencyId: number | null;

  @Column('boolean', { name: 'awaiting_countersign' })
  awaitingCountersign: boolean;

  @Column('text', { name: 'author_id' })
  authorId: string;

  @Column('text', { name: 'author_name' })
  authorName: string;

  /** site time, epoch ms */
  @Column('integer', { name: 'created_at' })
  createdAt: number;

  /** site time, epoch ms */
  @Column('integer', { name: 'updated_at' })
  updatedAt: number;

  /** site time the authorisation runs out, epoch ms */
  @Column('integer', { name: 'authorised_until', nullable: true })
  authorisedUntil: number | null;

  @Column('integer', { name: 'current_step', nullable: true })
  currentStep: number | null;

  /** site time the next step of a schedule is due, epoch ms */
  @Column('integer', { name: 'next_step_due', nullable: true })
  nextStepDue: number | null;

  /** OrderBody as JSON */
  @Column('text')
  body: string;
}
