import { Column, Entity, PrimaryColumn } from 'typeorm';

/**
 * One channel's readings over one minute of site time, kept for ever. Statistics cover the
 * readings not marked bad; the bad ones are only counted, so a bad value never shows as a
 * minimum or maximum. min_time and max_time keep where the extremes fell, so a chart can place them.
 */
@Entity('reading_aggregates')
export class ReadingAggregateRow {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  @PrimaryColumn('text')
  channel: string;

  /** start of the minute, epoch ms (site time) */
  @PrimaryColumn('integer')
  minute: number;

  /** readings not marked bad */
  @Column('integer')
  count: number;

  @Column('real', { nullable: true })
  min: number | null;

  @Column('integer', { name: 'min_time', nullable: true })
  minTime: number | null;

  @Column('real', { nullable: true })
  max: number | null;

  @Column('integer', { name: 'max_time', nullable: true })
  maxTime: number | null;

  @Column('real', { nullable: true })
  mean: number | null;

  @Column('integer', { name: 'suspect_count' })
  suspectCount: number;

  @Column('integer', { name: 'bad_count' })
  badCount: number;

  /** earliest gateway receipt of the minute's readings, epoch ms (maps site time to wall time) */
  @Column('integer', { name: 'first_received_at' })
  firstReceivedAt: number;
}

/** The minute aggregates rolled up per hour, for windows too long to read minute by minute. */
@Entity('reading_hour_aggregates')
export class ReadingHourAggregateRow {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  @PrimaryColumn('text')
  channel: string;

  /** start of the hour, epoch ms (site time) */
  @PrimaryColumn('integer')
  hour: number;

  @Column('integer')
  count: number;

  @Column('real', { nullable: true })
  min: number | null;

  @Column('integer', { name: 'min_time', nullable: true })
  minTime: number | null;

  @Column('real', { nullable: true })
  max: number | null;

  @Column('integer', { name: 'max_time', nullable: true })
  maxTime: number | null;

  @Column('real', { nullable: true })
  mean: number | null;

  @Column('integer', { name: 'suspect_count' })
  suspectCount: number;

  @Column('integer', { name: 'bad_count' })
  badCount: number;

  @Column('integer', { name: 'first_received_at' })
  firstReceivedAt: number;
}
