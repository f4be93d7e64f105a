import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * A stored measurement, value in the channel's SI unit. The unique key makes a repeated delivery of
 * the same message harmless; time is part of it so a device that restarts its counter loses nothing.
 */
@Entity('readings')
@Index('ux_readings_device_seq', ['reservoirId', 'deviceId', 'seq', 'time'], { unique: true })
@Index('ix_readings_channel_time', ['reservoirId', 'channel', 'time'])
export class Reading {
  @PrimaryGeneratedColumn()
  id: number;

  @Column('text', { name: 'reservoir_id' })
  reservoirId: string;

  @Column('text', { name: 'device_id' })
  deviceId: string;

  @Column('text')
  channel: string;

  @Column('integer')
  seq: number;

  /** measurement time, epoch ms (UTC) */
  @Column('integer')
  time: number;

  @Column('real')
  value: number;

  @Column('text')
  quality: string;

  /** gateway wall-clock time of receipt, epoch ms */
  @Column('integer', { name: 'received_at' })
  receivedAt: number;
}
