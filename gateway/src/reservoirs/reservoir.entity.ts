import { Column, Entity, PrimaryColumn } from 'typeorm';

@Entity('reservoirs')
export class Reservoir {
  @PrimaryColumn('text')
  id: string;

  @Column('text')
  name: string;

  @Column('text', { name: 'dam_name' })
  damName: string;

  @Column('text', { name: 'time_zone' })
  timeZone: string;

  /** the definition version in force; every change adds a row to reservoir_versions */
  @Column('integer', { name: 'current_version' })
  currentVersion: number;
}
