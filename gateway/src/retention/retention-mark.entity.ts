import { Column, Entity, PrimaryColumn } from 'typeorm';

/** How far each reservoir's readings are aggregated and pruned (exclusive bounds, site time). */
@Entity('retention_marks')
export class RetentionMarkRow {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  /** every minute before this is aggregated, epoch ms */
  @Column('integer', { name: 'aggregated_through' })
  aggregatedThrough: number;

  /** raw readings before this have been deleted, epoch ms */
  @Column('integer', { name: 'pruned_through' })
  prunedThrough: number;
}
