import { Injectable } from '@nestjs/common';
import type { Order } from '@stillwell/shared/orders';
import type { ClearanceResult, DownstreamClearance } from '../../orders/downstream-clearance';
import { ClearanceService } from '../clearance.service';
import { factsOf } from './order-facts';

/**
 * The orders module's DOWNSTREAM_CLEARANCE, for real (bind it with
 * `{ provide: DOWNSTREAM_CLEARANCE, useExisting: OrderClearance }`). Read-only: it runs inside the
 * order's execution transaction, so it must not queue writes of its own.
 */
@Injectable()
export class OrderClearance implements DownstreamClearance {
  constructor(private readonly clearance: ClearanceService) {}

  async check(order: Order): Promise<ClearanceResult> {
    const facts = factsOf(order);
    if (!facts) {
      return {
        ok: false,
        reason:
          'The release this order would make is not known (it was drafted without a fresh pool reading), so nobody can say who downstream must be told. Draft it again once the pool reading is fresh.',
      };
    }
    const verdict = await this.clearance.check(facts);
    if (!verdict.shortfalls.length) return { ok: true, note: verdict.summary };
    return {
      ok: false,
      reason: `${verdict.summary} See the downstream notices of order ${order.id}.`,
    };
  }
}
