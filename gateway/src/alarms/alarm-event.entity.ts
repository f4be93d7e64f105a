import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One raise, clear or handling action of an alarm: its history and the alarm-rate record. */
@Entity('alarm_events')
@Index('ix_alarm_events_condition', ['reservoirId', 'conditionId', 'siteTime'])
@Index('ix_alarm_events_time', ['reservoirId', 'siteTime'])
export class AlarmEventRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text', { name: 'condition_id' })
  conditionId: string;

  @Column('text')
  kind: string;

  @Column('integer', { name: 'site_time' })
  siteTime: number;

  @Column('integer', { name: 'wall_time' })
  wallTime: number;

  @Column('text')
  priority: string;

  /** raised while in service: presented to the operator */
  @Column('boolean')
  annunciated: boolean;

  @Column('text', { name: 'actor_id', nullable: true })
  actorId: string | null;

  @Column('text', { name: 'actor_name', nullable: true })
  actorName: string | null;

  @Column('text', { nullable: true })
  text: string | null;

  @Column('real', { nullable: true })
  value: number | null;

  @Column('integer', { name: 'logbook_seq', nullable: true })
  logbookSeq: number | null;
}
