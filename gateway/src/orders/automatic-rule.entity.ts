import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** The automatic rule of one gate or valve, and what its controller last said about it. */
@Entity('automatic_rules')
export class AutomaticRuleRow {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  @PrimaryColumn('text')
  control: string;

  @Column('text', { name: 'device_id' })
  deviceId: string;

  @Column('boolean')
  enabled: boolean;

  @Column('real', { name: 'rise_above' })
  riseAbove: number;

  @Column('real')
  target: number;

  /** the revision of the device's rule set this setting went out in */
  @Column('integer')
  revision: number;

  @Column('text', { name: 'updated_by_id', nullable: true })
  updatedById: string | null;

  @Column('text', { name: 'updated_by_name', nullable: true })
  updatedByName: string | null;

  /** site time, epoch ms */
  @Column('integer', { name: 'updated_at', nullable: true })
  updatedAt: number | null;

  /** pending, applied or rejected */
  @Column('text', { name: 'device_state' })
  deviceState: string;

  @Column('text', { name: 'device_detail', nullable: true })
  deviceDetail: string | null;

  @Column('integer', { name: 'last_triggered_at', nullable: true })
  lastTriggeredAt: number | null;
}

/** What a controller reported about its rules, once per event id. */
@Entity('automation_events')
@Index('ix_automation_events_time', ['reservoirId', 'time'])
export class AutomationEventRow {
  @PrimaryColumn('text', { name: 'event_id' })
  eventId: string;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text', { name: 'device_id' })
  deviceId: string;

  @Column('text', { nullable: true })
  control: string | null;

  @Column('text')
  kind: string;

  @Column('integer')
  revision: number;

  @Column('real', { nullable: true })
  pool: number | null;

  @Column('real', { nullable: true })
  target: number | null;

  @Column('text', { nullable: true })
  detail: string | null;

  /** site time at the gateway when received, epoch ms */
  @Column('integer')
  time: number;
}
