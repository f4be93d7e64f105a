import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { NoticeState } from '@stillwell/shared/notices';

/** The notice for one order and one zone. Times are site epoch ms. */
@Entity('release_notices')
export class NoticeRow {
  @PrimaryColumn('text')
  id: string;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text', { name: 'order_id' })
  orderId: string;

  @Column('text', { name: 'zone_id' })
  zoneId: string;

  @Column('text')
  state: NoticeState;

  @Column('boolean')
  emergency: boolean;

  @Column('real', { name: 'release_m3s' })
  releaseM3s: number;

  @Column('real', { name: 'previous_release_m3s', nullable: true })
  previousReleaseM3s: number | null;

  @Column('integer', { name: 'planned_start_at', nullable: true })
  plannedStartAt: number | null;

  @Column('integer', { name: 'start_at' })
  startAt: number;

  @Column('integer', { name: 'arrival_at' })
  arrivalAt: number;

  @Column('integer', { name: 'duration_s', nullable: true })
  durationS: number | null;

  @Column('integer', { name: 'travel_time_s' })
  travelTimeS: number;

  @Column('text', { name: 'beyond_table', nullable: true })
  beyondTable: 'below' | 'above' | null;

  @Column('text')
  subject: string;

  @Column('text')
  template: string;

  @Column('integer', { name: 'prepared_at' })
  preparedAt: number;

  @Column('integer', { name: 'sent_at', nullable: true })
  sentAt: number | null;

  @Column('text', { name: 'sent_by', nullable: true })
  sentBy: string | null;

  @Column('integer', { name: 'updated_at' })
  updatedAt: number;
}
