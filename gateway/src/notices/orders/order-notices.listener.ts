import { Injectable, Logger, OnModuleDestroy, OnModuleInit } from '@nestjs/common';
import type { Subscription } from 'rxjs';
import type { Order } from '@stillwell/shared/orders';
import { EmergencyService } from '../../orders/emergency.service';
import { OrderEvents } from '../../orders/order-events';
import { ClearanceService } from '../clearance.service';
import { NoticeBoardService } from '../notice-board.service';
import { NoticesService } from '../notices.service';
import { factsOf } from './order-facts';

const ENDED_UNSENT = ['declined', 'lapsed', 'withdrawn'] as const;

/**
 * Follows gate orders after each commit. A drafted order gets its notices prepared (and, under a
 * declared emergency, sent at once); a declined, lapsed or withdrawn one has its unsent notices
 * withdrawn; one executed under an emergency has any notice still unsent sent at once and the lead
 * time downstream did not get recorded. Work is done one event at a time, in order.
 */
@Injectable()
export class OrderNoticesListener implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger(OrderNoticesListener.name);
  private subscription?: Subscription;
  private chain: Promise<void> = Promise.resolve();
  /** orders whose emergency execution has been handled, so a later event does not log it twice */
  private readonly released = new Set<number>();

  constructor(
    private readonly events: OrderEvents,
    private readonly emergencies: EmergencyService,
    private readonly notices: NoticesService,
    private readonly board: NoticeBoardService,
    private readonly clearance: ClearanceService,
  ) {}

  onModuleInit(): void {
    this.subscription = this.events.events$.subscribe((event) => {
      if (event.kind !== 'order') return;
      this.chain = this.chain
        .then(() => this.follow(event.order))
        .catch((error: unknown) =>
          this.logger.error(`notices for order ${event.order.id}: ${String(error)}`),
        );
    });
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  /** Resolves when every event received so far has been handled (for tests and shutdown). */
  settled(): Promise<void> {
    return this.chain;
  }

  private async follow(order: Order): Promise<void> {
    const facts = factsOf(order);
    if (order.state === 'proposed' && facts) {
      const emergency = (await this.emergencies.current(order.reservoirId)) !== null;
      const existing = await this.board.list(order.reservoirId, { orderId: facts.orderId });
      if (existing.length && !emergency) return; // prepared when drafted; the liaison has it now
      await this.notices.prepareForOrder({ ...facts, emergency }, null);
      return;
    }
    if ((ENDED_UNSENT as readonly string[]).includes(order.state)) {
      await this.notices.withdrawOrder(String(order.id), null, `the order was ${order.state}`);
      return;
    }
    const waived = order.execution?.waived.includes('downstream-clearance') ?? false;
    if (order.execution && (waived || order.emergency) && facts && !this.released.has(order.id)) {
      this.released.add(order.id);
      await this.clearance.emergencyRelease(facts, null);
    }
  }
}
