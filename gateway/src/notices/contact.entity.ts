import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A person to tell in a zone. Deactivated rather than deleted: notices already sent point at them. */
@Entity('downstream_contacts')
export class ContactRow {
  @PrimaryColumn('text')
  id: string;

  @Column('text', { name: 'zone_id' })
  zoneId: string;

  @Column('text')
  organisation: string;

  @Column('text')
  person: string;

  @Column('text')
  role: string;

  @Column('text')
  email: string;

  @Column('text')
  phone: string;

  @Column('integer', { name: 'lead_time_s' })
  leadTimeS: number;

  @Column('integer', { name: 'escalation_order' })
  escalationOrder: number;

  @Column('integer', { name: 'ack_window_s' })
  ackWindowS: number;

  @Column('text', { name: 'user_id', nullable: true })
  userId: string | null;

  @Column('boolean')
  active: boolean;

  @Column('integer', { name: 'created_at' })
  createdAt: number;

  @Column('integer', { name: 'updated_at' })
  updatedAt: number;
}
