import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One condition's alarm as it stands (ISA-18.2 state), site times in epoch ms. */
@Entity('alarms')
export class AlarmRow {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  @PrimaryColumn('text', { name: 'condition_id' })
  conditionId: string;

  /** kind, label and priority as they were at the last change (a definition may drop the condition) */
  @Column('text')
  kind: string;

  @Column('text')
  label: string;

  @Column('text')
  priority: string;

  @Column('boolean')
  active: boolean;

  @Column('boolean')
  acknowledged: boolean;

  @Column('text')
  handling: string;

  @Column('integer', { name: 'shelved_until', nullable: true })
  shelvedUntil: number | null;

  @Column('text', { nullable: true })
  reason: string | null;

  @Column('text', { name: 'handled_by', nullable: true })
  handledBy: string | null;

  @Column('integer', { name: 'raised_at', nullable: true })
  raisedAt: number | null;

  @Column('integer', { name: 'cleared_at', nullable: true })
  clearedAt: number | null;

  @Column('integer', { name: 'acknowledged_at', nullable: true })
  acknowledgedAt: number | null;

  @Column('text', { name: 'acknowledged_by', nullable: true })
  acknowledgedBy: string | null;

  @Column('real', { nullable: true })
  value: number | null;

  @Column('real', { name: 'limit_value', nullable: true })
  limitValue: number | null;

  @Column('text')
  message: string;

  @Column('integer', { name: 'last_change' })
  lastChange: number;

  @Column('integer')
  activations: number;
}
