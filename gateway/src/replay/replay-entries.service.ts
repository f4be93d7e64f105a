import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { ReplayEntry, ReplayEntryPage } from '@stillwell/shared/replay';
import { LogbookEntryRow } from '../logbook/logbook-entry.entity';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { floorMinute } from '../retention/minute-aggregates';
import { ClockMapping, recordedSiteTime, type ClockAnchor } from './entry-times';

/** wall time either side of the mapped window still read, for entries stamped a little off the line */
const WALL_SLACK_MS = 60_000;
const MAX_DATE_MS = 8.64e15;

const isoOf = (ms: number) =>
  new Date(Math.max(-MAX_DATE_MS, Math.min(MAX_DATE_MS, Math.round(ms)))).toISOString();

export function encodeCursor(e: { siteTimeMs: number; seq: number }): string {
  return `${e.siteTimeMs}:${e.seq}`;
}

function after(e: ReplayEntry, cursor: { t: number; seq: number } | null): boolean {
  if (!cursor) return true;
  return e.siteTimeMs > cursor.t || (e.siteTimeMs === cursor.t && e.seq > cursor.seq);
}

/**
 * The logbook on the replay's site-time axis. The logbook stamps wall time; entries about the
 * plant also name the site time (payload.siteTime), which is used as it is. The others (shift
 * notes, sign-ins, ...) are placed by mapping their wall time through the readings' receipt
 * times (see entry-times.ts). The logbook is one for the gateway: entries naming another
 * reservoir are left out.
 */
@Injectable()
export class ReplayEntriesService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly reservoirs: ReservoirsService,
  ) {}

  async page(
    reservoirId: string,
    fromMs: number,
    toMs: number,
    cursor: { t: number; seq: number } | null,
    limit: number,
  ): Promise<ReplayEntryPage> {
    const all = await this.inWindow(reservoirId, fromMs, toMs);
    const rest = all.filter((e) => after(e, cursor));
    const entries = rest.slice(0, limit);
    const last = entries[entries.length - 1];
    return {
      entries,
      total: all.length,
      next: rest.length > limit && last ? encodeCursor(last) : null,
    };
  }

  /** Every entry of the window, in site-time order (then logbook order). */
  async inWindow(reservoirId: string, fromMs: number, toMs: number): Promise<ReplayEntry[]> {
    const map = await this.mapping(reservoirId, fromMs, toMs);
    const rows = await this.dataSource
      .getRepository(LogbookEntryRow)
      .createQueryBuilder('e')
      // ISO strings in UTC sort as text in time order
      .where('e.time >= :from AND e.time <= :to', {
        from: isoOf(map.toWall(fromMs) - WALL_SLACK_MS),
        to: isoOf(map.toWall(toMs) + WALL_SLACK_MS),
      })
      .orderBy('e.seq', 'ASC')
      .getMany();
    const out: ReplayEntry[] = [];
    for (const row of rows) {
      const payload = JSON.parse(row.payload) as Record<string, unknown>;
      if (typeof payload.reservoirId === 'string' && payload.reservoirId !== reservoirId) continue;
      const recorded = recordedSiteTime(payload);
      const siteTimeMs = Math.round(recorded ?? map.toSite(Date.parse(row.time)));
      if (siteTimeMs < fromMs || siteTimeMs > toMs) continue;
      out.push({
        seq: row.seq,
        siteTimeMs,
        timeSource: recorded === null ? 'estimated' : 'recorded',
        time: row.time,
        kind: row.kind,
        actorName: row.actorName,
        payload,
      });
    }
    return out.sort((a, b) => a.siteTimeMs - b.siteTimeMs || a.seq - b.seq);
  }

  /** Anchors at the window's two ends from the preferred pool gauge (raw, else its aggregates). */
  async mapping(reservoirId: string, fromMs: number, toMs: number): Promise<ClockMapping> {
    const { definition } = this.reservoirs.get(reservoirId);
    const channel = definition.poolChannels[0] ?? definition.channels[0]!.id;
    const a =
      (await this.anchor(reservoirId, channel, fromMs, 'first')) ??
      (await this.anchor(reservoirId, channel, fromMs, 'last'));
    const b =
      (await this.anchor(reservoirId, channel, toMs, 'last')) ??
      (await this.anchor(reservoirId, channel, toMs, 'first'));
    return new ClockMapping(a, b);
  }

  private async anchor(
    reservoirId: string,
    channel: string,
    atMs: number,
    side: 'first' | 'last',
  ): Promise<ClockAnchor | null> {
    const [op, order] = side === 'first' ? ['>=', 'ASC'] : ['<=', 'DESC'];
    const [raw] = (await this.dataSource.query(
      `SELECT "time" AS "s", "received_at" AS "w" FROM "readings"
       WHERE "reservoir_id" = ? AND "channel" = ? AND "time" ${op} ? ORDER BY "time" ${order} LIMIT 1`,
      [reservoirId, channel, atMs],
    )) as Array<{ s: number; w: number }>;
    const [agg] = raw
      ? [raw]
      : ((await this.dataSource.query(
          `SELECT "minute" AS "s", "first_received_at" AS "w" FROM "reading_aggregates"
           WHERE "reservoir_id" = ? AND "channel" = ? AND "minute" ${op} ?
           ORDER BY "minute" ${order} LIMIT 1`,
          [reservoirId, channel, floorMinute(atMs)],
        )) as Array<{ s: number; w: number }>);
    return agg ? { siteMs: Number(agg.s), wallMs: Number(agg.w) } : null;
  }
}
