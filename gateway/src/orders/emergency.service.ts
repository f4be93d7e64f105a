import { Injectable } from '@nestjs/common';
import { IsNull, type EntityManager } from 'typeorm';
import { can } from '@stillwell/shared/access';
import type { DeclareEmergencyRequest, Emergency } from '@stillwell/shared/orders';
import { actorOf, type Principal } from '../auth/principal';
import { SiteClockService } from '../clock/site-clock.service';
import { AccessError } from '../common/errors/access-error';
import { LogbookService } from '../logbook/logbook.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { EmergencyRow } from './emergency.entity';
import { OrderError } from './order-error';
import { OrderEvents } from './order-events';
import { iso } from './order-view';
import { OrderStore } from './order-store';

export function toEmergency(r: EmergencyRow): Emergency {
  return {
    id: r.id,
    reservoirId: r.reservoirId,
    level: r.level,
    reason: r.reason,
    declaredBy: { userId: r.declaredById, username: r.declaredByName },
    declaredAt: iso(r.declaredAt),
    ended:
      r.endedAt === null
        ? null
        : {
            by: { userId: r.endedById ?? '', username: r.endedByName ?? '' },
            at: iso(r.endedAt),
            comment: r.endReason ?? '',
          },
  };
}

/**
 * Emergencies under the emergency action plan. While one is in force an operator may execute an
 * order without prior authorisation; such orders are flagged and must be countersigned after.
 * Declaring and ending are a duty engineer's stepped-up acts, each in the logbook.
 */
@Injectable()
export class EmergencyService {
  constructor(
    private readonly store: OrderStore,
    private readonly reservoirs: ReservoirsService,
    private readonly clock: SiteClockService,
    private readonly logbook: LogbookService,
    private readonly events: OrderEvents,
  ) {}

  async current(
    reservoirId: string,
    m: EntityManager = this.store.manager,
  ): Promise<Emergency | null> {
    const row = await m.findOne(EmergencyRow, {
      where: { reservoirId, endedAt: IsNull() },
      order: { id: 'DESC' },
    });
    return row ? toEmergency(row) : null;
  }

  async declare(
    reservoirId: string,
    req: DeclareEmergencyRequest,
    p: Principal,
  ): Promise<Emergency> {
    this.reservoirs.get(reservoirId);
    if (!can(p.roles, 'emergency.declare')) throw new AccessError('forbidden');
    // The matrix lets operators declare too; the two-person rule does not: whoever may execute
    // without authorisation must not be the one who lifts the need for it.
    if (!p.roles.includes('engineer'))
      throw new OrderError('engineer-required', 'Only a duty engineer may declare an emergency');
    const emergency = await this.store.transaction(async (tx) => {
      const open = await this.current(reservoirId, tx);
      if (open)
        throw new OrderError(
          'emergency-active',
          `An emergency (level ${open.level}) is already in force since ${open.declaredAt}`,
        );
      const now = this.clock.now(reservoirId);
      const row = await tx.save(EmergencyRow, {
        reservoirId,
        level: req.level,
        reason: req.reason,
        declaredById: p.userId,
        declaredByName: p.username,
        declaredAt: now,
        endedById: null,
        endedByName: null,
        endedAt: null,
        endReason: null,
      });
      await this.logbook.append(
        {
          kind: 'emergency.declared',
          actor: actorOf(p),
          payload: {
            emergencyId: row.id,
            reservoirId,
            level: req.level,
            reason: req.reason,
            siteTime: iso(now),
          },
        },
        tx,
      );
      return toEmergency(row);
    });
    this.events.emit({ kind: 'emergency', reservoirId, emergency });
    return emergency;
  }

  async end(reservoirId: string, reason: string, p: Principal): Promise<Emergency> {
    this.reservoirs.get(reservoirId);
    if (!p.roles.includes('engineer'))
      throw new OrderError('engineer-required', 'Only a duty engineer may end an emergency');
    const ended = await this.store.transaction(async (tx) => {
      const row = await tx.findOne(EmergencyRow, {
        where: { reservoirId, endedAt: IsNull() },
        order: { id: 'DESC' },
      });
      if (!row) throw new OrderError('no-emergency', 'No emergency is in force');
      const now = this.clock.now(reservoirId);
      Object.assign(row, {
        endedById: p.userId,
        endedByName: p.username,
        endedAt: now,
        endReason: reason,
      });
      await tx.save(EmergencyRow, row);
      await this.logbook.append(
        {
          kind: 'emergency.ended',
          actor: actorOf(p),
          payload: {
            emergencyId: row.id,
            reservoirId,
            level: row.level,
            reason,
            siteTime: iso(now),
          },
        },
        tx,
      );
      return toEmergency(row);
    });
    this.events.emit({ kind: 'emergency', reservoirId, emergency: null });
    return ended;
  }
}
