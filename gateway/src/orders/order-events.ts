import { Injectable, OnModuleDestroy } from '@nestjs/common';
import { Subject } from 'rxjs';
import type { AutomaticRule, Emergency, Order, OrderAlarm } from '@stillwell/shared/orders';

export type OrderEvent =
  | { kind: 'order'; reservoirId: string; order: Order }
  | { kind: 'emergency'; reservoirId: string; emergency: Emergency | null }
  | { kind: 'automation'; reservoirId: string; rule: AutomaticRule }
  | { kind: 'alarm'; reservoirId: string; alarm: OrderAlarm };

/** Changes to push to consoles. Emitted only after the transaction that made them committed. */
@Injectable()
export class OrderEvents implements OnModuleDestroy {
  readonly events$ = new Subject<OrderEvent>();

  emit(event: OrderEvent): void {
    this.events$.next(event);
  }

  onModuleDestroy(): void {
    this.events$.complete();
  }
}
