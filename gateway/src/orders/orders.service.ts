import { Inject, Injectable } from '@nestjs/common';
import { can, type Action } from '@stillwell/shared/access';
import {
  checkStepsAgainst,
  controlsOf,
  countersignRefusal,
  orderImpact,
  reviewRefusal,
  withdrawRefusal,
  type CreateOrderRequest,
  type Order,
  type OrderState,
  type Refusal,
} from '@stillwell/shared/orders';
import { actorOf, type Principal } from '../auth/principal';
import { SiteClockService } from '../clock/site-clock.service';
import { AccessError } from '../common/errors/access-error';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { StatusService } from '../telemetry/status.service';
import { ForecastLinkService } from './forecast-link.service';
import { OrderError } from './order-error';
import { OrderStore } from './order-store';
import { iso, toOrder, type OrderBody } from './order-view';
import { OrderRow } from './order.entity';
import { OrderCommandRow } from './order-command.entity';
import { ORDER_SETTINGS } from './order-tokens';
import type { OrderSettings } from './order-settings';

export function requireCan(p: Principal, action: Action): void {
  // the guard checks this on every route; checked again here because the rule protects people
  if (!can(p.roles, action)) throw new AccessError('forbidden');
}

export function refuse(refusal: Refusal | null): void {
  if (refusal) throw new OrderError(refusal.code, refusal.message);
}

const person = (p: Principal) => ({ userId: p.userId, username: p.username });

export interface OrderFilter {
  state?: OrderState;
  awaitingCountersign?: boolean;
  limit?: number;
}

/** Drafting, reviewing (the two-person rule), withdrawing and countersigning orders. */
@Injectable()
export class OrdersService {
  constructor(
    private readonly store: OrderStore,
    private readonly reservoirs: ReservoirsService,
    private readonly status: StatusService,
    private readonly clock: SiteClockService,
    private readonly forecasts: ForecastLinkService,
    @Inject(ORDER_SETTINGS) private readonly settings: OrderSettings,
  ) {}

  async list(reservoirId: string, filter: OrderFilter = {}): Promise<Order[]> {
    this.reservoirs.get(reservoirId);
    const qb = this.store.manager
      .getRepository(OrderRow)
      .createQueryBuilder('o')
      .where('o.reservoir_id = :reservoirId', { reservoirId });
    if (filter.state) qb.andWhere('o.state = :state', { state: filter.state });
    if (filter.awaitingCountersign !== undefined)
      qb.andWhere('o.awaiting_countersign = :a', { a: filter.awaitingCountersign ? 1 : 0 });
    const rows = await qb
      .orderBy('o.id', 'DESC')
      .take(filter.limit ?? 100)
      .getMany();
    if (!rows.length) return [];
    const commands = await this.store.manager
      .getRepository(OrderCommandRow)
      .createQueryBuilder('c')
      .where('c.order_id IN (:...ids)', { ids: rows.map((r) => r.id) })
      .getMany();
    return rows.map((r) =>
      toOrder(
        r,
        commands.filter((c) => c.orderId === r.id),
      ),
    );
  }

  get(id: number): Promise<Order> {
    return this.store.view(id);
  }

  /**
   * A new order, waiting for review. The current forecast run (when there is one) and the
   * routed effect are attached now, so the reviewer sees what the draft rested on.
   */
  async draft(reservoirId: string, req: CreateOrderRequest, p: Principal): Promise<Order> {
    requireCan(p, 'orders.draft');
    const { definition } = this.reservoirs.get(reservoirId);
    const problems = checkStepsAgainst(definition, req.steps);
    if (problems.length)
      throw new OrderError(
        'invalid-order',
        problems.map((x) => `${x.path}: ${x.message}`).join('; '),
      );
    const now = this.clock.now(reservoirId);
    const status = this.status.status(reservoirId);
    const openings: Record<string, number> = {};
    for (const c of controlsOf(definition)) {
      const s = status.channels.find((x) => x.channel === c.channel);
      if (s) openings[c.id] = s.value;
    }
    const forecast = await this.forecasts.current(reservoirId, now);
    const impact = status.pool
      ? orderImpact({
          definition,
          pool: status.pool.elevation,
          openings,
          steps: req.steps,
          inflow: status.inflow,
          forecast: forecast?.inflow,
        })
      : null;
    const body: OrderBody = {
      steps: req.steps,
      reason: req.reason,
      plannedStart: req.plannedStart ? iso(Date.parse(req.plannedStart)) : iso(now),
      author: person(p),
      forecast: forecast?.link ?? null,
      impact,
      decision: null,
      execution: null,
      fault: null,
      countersign: null,
      withdrawal: null,
    };
    const id = await this.store.transaction(async (tx) => {
      const row = await tx.save(OrderRow, {
        reservoirId,
        state: 'proposed',
        emergency: false,
        emergencyId: null,
        awaitingCountersign: false,
        authorId: p.userId,
        authorName: p.username,
        createdAt: now,
        updatedAt: now,
        authorisedUntil: null,
        currentStep: null,
        nextStepDue: null,
        body: JSON.stringify(body),
      });
      await this.store.log(
        tx,
        'order.drafted',
        actorOf(p),
        { id: row.id, reservoirId, steps: req.steps },
        now,
        {
          steps: req.steps,
          reason: req.reason,
          plannedStart: body.plannedStart,
          forecast: body.forecast,
          impact,
        },
      );
      return row.id;
    });
    return this.store.announce(id);
  }

  /** Authorise or decline: a duty engineer who is not the author, stepped up (the route says so). */
  async review(
    id: number,
    outcome: 'authorised' | 'declined',
    comment: string,
    p: Principal,
  ): Promise<Order> {
    requireCan(p, 'orders.authorise');
    await this.store.transaction(async (tx) => {
      const loaded = await this.store.load(tx, id);
      const { row, body, order } = loaded;
      refuse(reviewRefusal(order, p));
      const now = this.clock.now(order.reservoirId);
      body.decision = { outcome, by: person(p), at: iso(now), comment };
      this.store.move(loaded, outcome);
      row.authorisedUntil =
        outcome === 'authorised' ? now + this.settings.authorisationTtlMs : null;
      await this.store.save(tx, row, body, now);
      await this.store.log(tx, `order.${outcome}`, actorOf(p), order, now, {
        comment,
        ...(row.authorisedUntil !== null ? { authorisedUntil: iso(row.authorisedUntil) } : {}),
      });
    });
    return this.store.announce(id);
  }

  /** Taken back by an operator: before execution, or between the steps of a schedule. */
  async withdraw(id: number, comment: string, p: Principal): Promise<Order> {
    requireCan(p, 'orders.draft');
    await this.store.transaction(async (tx) => {
      const loaded = await this.store.load(tx, id);
      const { row, body, order } = loaded;
      refuse(withdrawRefusal(order));
      const now = this.clock.now(order.reservoirId);
      const remaining =
        order.state === 'holding' ? order.steps.length - 1 - (order.currentStep ?? 0) : null;
      body.withdrawal = { by: person(p), at: iso(now), comment };
      this.store.move(loaded, 'withdrawn');
      row.nextStepDue = null;
      await this.store.save(tx, row, body, now);
      await this.store.log(tx, 'order.withdrawn', actorOf(p), order, now, {
        comment,
        from: order.state,
        ...(remaining !== null ? { stepsCancelled: remaining } : {}),
      });
    });
    return this.store.announce(id);
  }

  /** An emergency action, countersigned afterwards by a duty engineer who took no part in it. */
  async countersign(id: number, comment: string, p: Principal): Promise<Order> {
    requireCan(p, 'orders.countersign');
    await this.store.transaction(async (tx) => {
      const { row, body, order } = await this.store.load(tx, id);
      refuse(countersignRefusal(order, p));
      const now = this.clock.now(order.reservoirId);
      body.countersign = { by: person(p), at: iso(now), comment };
      row.awaitingCountersign = false;
      await this.store.save(tx, row, body, now);
      await this.store.log(tx, 'order.countersigned', actorOf(p), order, now, {
        comment,
        emergencyId: order.emergencyId,
      });
    });
    return this.store.announce(id);
  }
}
