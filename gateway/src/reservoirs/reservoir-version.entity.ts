import { Column, Entity, PrimaryColumn } from 'typeorm';

/** One version of a reservoir's definition, never changed once written. */
@Entity('reservoir_versions')
export class ReservoirVersion {
  @PrimaryColumn('text', { name: 'reservoir_id' })
  reservoirId: string;

  @PrimaryColumn('integer')
  version: number;

  /** the ReservoirDefinition as JSON */
  @Column('text')
  definition: string;

  @Column('integer', { name: 'created_at' })
  createdAt: number;

  @Column('text', { name: 'created_by' })
  createdBy: string;

  /** what the version changed: seed, storage-table, structures (null on rows older than the column) */
  @Column('text', { nullable: true })
  change: string | null;

  /** the uploader's note */
  @Column('text', { nullable: true })
  note: string | null;
}
