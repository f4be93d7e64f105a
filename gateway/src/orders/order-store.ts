import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, In, type EntityManager } from 'typeorm';
import { ACTIVE_STATES, canMove, type Order, type OrderState } from '@stillwell/shared/orders';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { OrderError } from './order-error';
import { OrderEvents } from './order-events';
import { bodyOf, controlsOfSteps, iso, toOrder, type OrderBody } from './order-view';
import { OrderRow } from './order.entity';
import { OrderCommandRow } from './order-command.entity';

export interface LoadedOrder {
  row: OrderRow;
  body: OrderBody;
  order: Order;
}

/**
 * Reading and writing orders. Every write runs behind the one write queue in one transaction
 * with the logbook entry that records it; consoles hear of it only after the commit.
 */
@Injectable()
export class OrderStore {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly events: OrderEvents,
  ) {}

  get manager(): EntityManager {
    return this.dataSource.manager;
  }

  /** One write job: a transaction behind the write queue. */
  transaction<T>(job: (tx: EntityManager) => Promise<T>): Promise<T> {
    return this.writes.run(() => this.dataSource.transaction(job));
  }

  async load(m: EntityManager, id: number): Promise<LoadedOrder> {
    const row = await m.findOneBy(OrderRow, { id });
    if (!row) throw new OrderError('order-not-found', `No order ${id}`);
    const commands = await m.findBy(OrderCommandRow, { orderId: id });
    return { row, body: bodyOf(row), order: toOrder(row, commands) };
  }

  async view(id: number, m: EntityManager = this.manager): Promise<Order> {
    return (await this.load(m, id)).order;
  }

  /** Writes the row and its body back; the caller has changed them. */
  async save(m: EntityManager, row: OrderRow, body: OrderBody, siteNow: number): Promise<void> {
    row.body = JSON.stringify(body);
    row.updatedAt = siteNow;
    await m.save(OrderRow, row);
  }

  /** Changes the state, refusing any move the shared state machine does not allow. */
  move(loaded: Pick<LoadedOrder, 'row' | 'order'>, to: OrderState): void {
    const from = loaded.row.state as OrderState;
    if (!canMove(from, to))
      throw new OrderError(
        'wrong-state',
        `Order ${loaded.order.id} cannot go from ${from} to ${to}`,
      );
    loaded.row.state = to;
  }

  /** Controls the active orders of a reservoir are driving: control id -> order id. */
  async busyControls(m: EntityManager, reservoirId: string): Promise<Map<string, number>> {
    const rows = await m.findBy(OrderRow, { reservoirId, state: In([...ACTIVE_STATES]) });
    const busy = new Map<string, number>();
    for (const r of rows) for (const c of controlsOfSteps(bodyOf(r).steps)) busy.set(c, r.id);
    return busy;
  }

  /** A logbook entry about an order, in the caller's transaction. */
  log(
    m: EntityManager,
    kind: string,
    actor: LogbookActor | null,
    order: Pick<Order, 'id' | 'reservoirId' | 'steps'>,
    siteNow: number,
    payload: Record<string, unknown> = {},
  ): Promise<unknown> {
    return this.logbook.append(
      {
        kind,
        actor,
        payload: {
          orderId: order.id,
          reservoirId: order.reservoirId,
          controls: controlsOfSteps(order.steps),
          siteTime: iso(siteNow),
          ...(actor ? {} : { by: 'gateway' }),
          ...payload,
        },
      },
      m,
    );
  }

  /** After the commit: tell the consoles. */
  async announce(id: number): Promise<Order> {
    const order = await this.view(id);
    this.events.emit({ kind: 'order', reservoirId: order.reservoirId, order });
    return order;
  }
}
