import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { DeliveryState } from '@stillwell/shared/notices';

/** One message of a notice to one contact. Lead time and window are copied: later edits do not move them. */
@Entity('notice_recipients')
export class RecipientRow {
  @PrimaryColumn('text')
  id: string;

  @Column('text', { name: 'notice_id' })
  noticeId: string;

  @Column('text', { name: 'contact_id' })
  contactId: string;

  @Column('integer', { name: 'chain_level' })
  chainLevel: number;

  @Column('text')
  reason: 'first-call' | 'escalation';

  @Column('integer', { name: 'lead_time_s' })
  leadTimeS: number;

  @Column('integer', { name: 'ack_window_s' })
  ackWindowS: number;

  @Column('text')
  delivery: DeliveryState;

  @Column('integer', { name: 'sent_at', nullable: true })
  sentAt: number | null;

  @Column('integer', { name: 'delivered_at', nullable: true })
  deliveredAt: number | null;

  @Column('integer', { name: 'bounced_at', nullable: true })
  bouncedAt: number | null;

  @Column('text', { name: 'bounce_reason', nullable: true })
  bounceReason: string | null;

  @Column('text', { name: 'message_id', nullable: true })
  messageId: string | null;

  @Column('integer', { name: 'acknowledged_at', nullable: true })
  acknowledgedAt: number | null;

  @Column('text', { name: 'acknowledged_via', nullable: true })
  acknowledgedVia: 'link' | 'console' | null;

  @Column('integer', { name: 'escalated_at', nullable: true })
  escalatedAt: number | null;
}
