import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** One command of an order: one step to one gate controller, under a unique command id. */
@Entity('order_commands')
@Index('ix_order_commands_order', ['orderId'])
export class OrderCommandRow {
  @PrimaryColumn('text', { name: 'command_id' })
  commandId: string;

  @Column('integer', { name: 'order_id' })
  orderId: number;

  @Column('integer')
  step: number;

  @Column('text', { name: 'device_id' })
  deviceId: string;

  /** { control: opening } as JSON */
  @Column('text')
  targets: string;

  /** reported positions when sent, { control: opening } as JSON */
  @Column('text', { name: 'from_positions' })
  fromPositions: string;

  @Column('text')
  state: string;

  /** site time, epoch ms */
  @Column('integer', { name: 'sent_at', nullable: true })
  sentAt: number | null;

  /** wall time, epoch ms: the acknowledgement deadline counts from here */
  @Column('integer', { name: 'sent_wall', nullable: true })
  sentWall: number | null;

  @Column('boolean')
  resent: boolean;

  /** site time, epoch ms */
  @Column('integer', { name: 'ack_at', nullable: true })
  ackAt: number | null;

  @Column('text', { nullable: true })
  reason: string | null;

  /** site time, epoch ms */
  @Column('integer', { name: 'confirmed_at', nullable: true })
  confirmedAt: number | null;
}
