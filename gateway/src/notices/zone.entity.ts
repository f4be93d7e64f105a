import { Column, Entity, PrimaryColumn } from 'typeorm';

/** A place below the dam that a large enough release reaches. */
@Entity('downstream_zones')
export class ZoneRow {
  @PrimaryColumn('text')
  id: string;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text')
  name: string;

  @Column('text')
  kind: string;

  @Column('real', { name: 'distance_m' })
  distanceM: number;

  @Column('real', { name: 'affected_at_m3s' })
  affectedAtM3s: number;

  /** JSON TravelTimeRow[], ascending release */
  @Column('text', { name: 'travel_times' })
  travelTimes: string;

  @Column('integer', { name: 'created_at' })
  createdAt: number;

  @Column('integer', { name: 'updated_at' })
  updatedAt: number;
}
