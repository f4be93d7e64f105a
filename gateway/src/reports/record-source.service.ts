import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { Brackets, DataSource } from 'typeorm';
import { AlarmEventRow } from '../alarms/alarm-event.entity';
import { AlarmRow } from '../alarms/alarm.entity';
import { ForecastRunRow } from '../forecasts/forecast-run.entity';
import { LogbookEntryRow } from '../logbook/logbook-entry.entity';
import { ContactRow } from '../notices/contact.entity';
import { NoticeRow } from '../notices/notice.entity';
import { RecipientRow } from '../notices/recipient.entity';
import { ZoneRow } from '../notices/zone.entity';
import { bodyOf } from '../orders/order-view';
import { OrderRow } from '../orders/order.entity';
import type { AlarmEventFacts, AlarmLabel } from './figures/alarm-figures';
import { RUN_SEARCH_MS, type StoredRunSummary } from './figures/forecast-checks';
import type { NoticeRecipientFacts } from './figures/notice-leads';
import type { OrderEntry, OrderFacts } from './figures/order-timelines';

const HOUR = 3_600_000;

/**
 * Read-only queries of the other features' records for a window (site epoch ms, [from, to)).
 * Nothing here writes; the tables belong to their own modules.
 */
@Injectable()
export class RecordSource {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** Forecast runs that can be "the forecast at" 1-6 h before any peak in the window. */
  async forecastRuns(reservoirId: string, from: number, to: number): Promise<StoredRunSummary[]> {
    return this.dataSource
      .getRepository(ForecastRunRow)
      .createQueryBuilder('f')
      .select(['f.id', 'f.computedAt', 'f.peakElevation', 'f.peakTime', 'f.peakP90'])
      .where('f.reservoir_id = :reservoirId', { reservoirId })
      .andWhere('f.computed_at >= :a AND f.computed_at < :b', {
        a: from - 6 * HOUR - RUN_SEARCH_MS,
        b: to,
      })
      .orderBy('f.computed_at')
      .getMany();
  }

  /** Orders drafted before the window's end and still changing after its start. */
  async orders(
    reservoirId: string,
    from: number,
    to: number,
  ): Promise<Array<OrderFacts & { executedAt: number | null }>> {
    const rows = await this.dataSource
      .getRepository(OrderRow)
      .createQueryBuilder('o')
      .where('o.reservoir_id = :reservoirId', { reservoirId })
      .andWhere('o.created_at < :to AND o.updated_at >= :from', { from, to })
      .orderBy('o.id')
      .getMany();
    return rows.map((r) => {
      const body = bodyOf(r);
      return {
        id: r.id,
        state: r.state,
        emergency: r.emergency,
        reason: body.reason,
        executedAt: body.execution ? Date.parse(body.execution.at) : null,
      };
    });
  }

  /** The logbook entries about these orders (order.* and command.*), in chain order. */
  async orderEntries(orderIds: readonly number[]): Promise<OrderEntry[]> {
    if (!orderIds.length) return [];
    const rows = await this.dataSource
      .getRepository(LogbookEntryRow)
      .createQueryBuilder('e')
      .where(
        new Brackets((w) => w.where("e.kind LIKE 'order.%'").orWhere("e.kind LIKE 'command.%'")),
      )
      .andWhere("CAST(json_extract(e.payload, '$.orderId') AS INTEGER) IN (:...ids)", {
        ids: orderIds,
      })
      .orderBy('e.seq')
      .getMany();
    return rows.map((r) => {
      const payload = JSON.parse(r.payload) as { orderId: number; siteTime?: string };
      return {
        orderId: Number(payload.orderId),
        kind: r.kind,
        // the order's own site time; the entry's wall time when the payload has none
        t: Date.parse(payload.siteTime ?? r.time),
        actor: r.actorName,
        seq: r.seq,
      };
    });
  }

  /** Each recipient of the notices of these orders, or of notices prepared in the window. */
  async noticeRecipients(
    reservoirId: string,
    from: number,
    to: number,
    orders: ReadonlyArray<{ id: number; executedAt: number | null }>,
  ): Promise<NoticeRecipientFacts[]> {
    const ids = orders.map((o) => String(o.id));
    const q = this.dataSource
      .getRepository(NoticeRow)
      .createQueryBuilder('n')
      .where('n.reservoir_id = :reservoirId', { reservoirId })
      .andWhere(
        new Brackets((w) => {
          w.where('n.prepared_at >= :from AND n.prepared_at < :to', { from, to });
          if (ids.length) w.orWhere('n.order_id IN (:...ids)', { ids });
        }),
      )
      .orderBy('n.prepared_at');
    const notices = await q.getMany();
    if (!notices.length) return [];
    const recipients = await this.dataSource
      .getRepository(RecipientRow)
      .createQueryBuilder('r')
      .where('r.notice_id IN (:...ids)', { ids: notices.map((n) => n.id) })
      .orderBy('r.chain_level')
      .addOrderBy('r.id')
      .getMany();
    const contacts = new Map(
      (await this.dataSource.getRepository(ContactRow).find()).map((c) => [c.id, c]),
    );
    const zones = new Map(
      (await this.dataSource.getRepository(ZoneRow).findBy({ reservoirId })).map((z) => [z.id, z]),
    );
    const executed = new Map(orders.map((o) => [String(o.id), o.executedAt]));
    return notices.flatMap((n) =>
      recipients
        .filter((r) => r.noticeId === n.id)
        .map((r) => ({
          noticeId: n.id,
          orderId: n.orderId,
          zoneName: zones.get(n.zoneId)?.name ?? n.zoneId,
          contactName: contacts.get(r.contactId)?.person ?? r.contactId,
          sentAt: r.sentAt,
          leadTimeS: r.leadTimeS,
          acknowledgedAt: r.acknowledgedAt,
          plannedStartAt: n.startAt,
          executedAt: executed.get(n.orderId) ?? null,
        })),
    );
  }

  /** Alarm events of the window, and each condition's label and priority as they stand. */
  async alarmEvents(
    reservoirId: string,
    from: number,
    to: number,
  ): Promise<{ events: AlarmEventFacts[]; labels: Map<string, AlarmLabel> }> {
    const rows = await this.dataSource
      .getRepository(AlarmEventRow)
      .createQueryBuilder('a')
      .select(['a.id', 'a.conditionId', 'a.kind', 'a.siteTime'])
      .where('a.reservoir_id = :reservoirId', { reservoirId })
      .andWhere('a.site_time >= :from AND a.site_time < :to', { from, to })
      .andWhere("a.kind IN ('raised', 'acknowledged')")
      .getMany();
    const alarms = await this.dataSource.getRepository(AlarmRow).findBy({ reservoirId });
    return {
      events: rows.map((r) => ({
        conditionId: r.conditionId,
        kind: r.kind,
        t: r.siteTime,
        id: r.id,
      })),
      labels: new Map(alarms.map((a) => [a.conditionId, { label: a.label, priority: a.priority }])),
    };
  }
}
