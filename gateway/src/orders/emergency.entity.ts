import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** An emergency declared under the emergency action plan; in force until ended. */
@Entity('emergencies')
export class EmergencyRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('integer')
  level: number;

  @Column('text')
  reason: string;

  @Column('text', { name: 'declared_by_id' })
  declaredById: string;

  @Column('text', { name: 'declared_by_name' })
  declaredByName: string;

  /** site time, epoch ms */
  @Column('integer', { name: 'declared_at' })
  declaredAt: number;

  @Column('text', { name: 'ended_by_id', nullable: true })
  endedById: string | null;

  @Column('text', { name: 'ended_by_name', nullable: true })
  endedByName: string | null;

  @Column('integer', { name: 'ended_at', nullable: true })
  endedAt: number | null;

  @Column('text', { name: 'end_reason', nullable: true })
  endReason: string | null;
}
