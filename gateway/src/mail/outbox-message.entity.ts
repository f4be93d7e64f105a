import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One message the demo mail server accepted, as it arrived (demo mode only). */
@Entity('demo_outbox')
export class OutboxMessageRow {
  @PrimaryGeneratedColumn('increment')
  id: number;

  /** wall-clock epoch ms */
  @Column('integer', { name: 'received_at' })
  receivedAt: number;

  @Column('text', { name: 'envelope_from' })
  envelopeFrom: string;

  /** JSON string[] */
  @Column('text', { name: 'envelope_to' })
  envelopeTo: string;

  @Column('text')
  subject: string;

  /** the message source, RFC 5322 */
  @Column('text')
  raw: string;
}
