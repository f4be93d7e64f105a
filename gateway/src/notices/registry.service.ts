import { randomUUID } from 'node:crypto';
import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, type EntityManager } from 'typeorm';
import {
  parseContactsCsv,
  type Contact,
  type ContactInput,
  type ImportResult,
  type TravelTimeRow,
  type Zone,
  type ZoneInput,
} from '@stillwell/shared/notices';
import { WriteQueueService } from '../database/write-queue.service';
import { LogbookService, type LogbookActor } from '../logbook/logbook.service';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { rolesOf } from '../users/user-view';
import { UsersService } from '../users/users.service';
import { ContactRow } from './contact.entity';
import { ZoneRow } from './zone.entity';

export function travelTimesOf(zone: ZoneRow): TravelTimeRow[] {
  return JSON.parse(zone.travelTimes) as TravelTimeRow[];
}

/** The downstream registry: zones below each dam and the people to tell in them. */
@Injectable()
export class RegistryService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly writes: WriteQueueService,
    private readonly logbook: LogbookService,
    private readonly reservoirs: ReservoirsService,
    private readonly users: UsersService,
  ) {}

  transaction<T>(job: (tx: EntityManager) => Promise<T>): Promise<T> {
    return this.writes.run(() => this.dataSource.transaction(job));
  }

  zoneRows(reservoirId: string, tx: EntityManager = this.dataSource.manager): Promise<ZoneRow[]> {
    return tx.find(ZoneRow, { where: { reservoirId }, order: { distanceM: 'ASC' } });
  }

  async zones(reservoirId: string): Promise<Zone[]> {
    this.reservoirs.get(reservoirId);
    const rows = await this.zoneRows(reservoirId);
    const contacts = await this.dataSource
      .getRepository(ContactRow)
      .find({ where: { active: true } });
    return rows.map((z) => this.zoneView(z, contacts.filter((c) => c.zoneId === z.id).length));
  }

  private zoneView(z: ZoneRow, contactCount: number): Zone {
    return {
      id: z.id,
      reservoirId: z.reservoirId,
      name: z.name,
      kind: z.kind as Zone['kind'],
      distanceM: z.distanceM,
      affectedAtM3s: z.affectedAtM3s,
      travelTimes: travelTimesOf(z),
      contactCount,
      updatedAt: z.updatedAt,
    };
  }

  async saveZone(
    reservoirId: string,
    id: string | null,
    input: ZoneInput,
    actor: LogbookActor | null,
  ): Promise<Zone> {
    this.reservoirs.get(reservoirId);
    const row = await this.transaction(async (tx) => {
      const now = Date.now();
      const clash = await tx.findOneBy(ZoneRow, { reservoirId, name: input.name });
      if (clash && clash.id !== id)
        throw new BadRequestException([`name: a zone called "${input.name}" exists already`]);
      let zone: ZoneRow;
      if (id) {
        const found = await tx.findOneBy(ZoneRow, { id, reservoirId });
        if (!found) throw new NotFoundException(`No zone "${id}" below ${reservoirId}`);
        zone = found;
      } else {
        zone = tx.create(ZoneRow, { id: randomUUID(), reservoirId, createdAt: now });
      }
      Object.assign(zone, {
        name: input.name,
        kind: input.kind,
        distanceM: input.distanceM,
        affectedAtM3s: input.affectedAtM3s,
        travelTimes: JSON.stringify(input.travelTimes),
        updatedAt: now,
      });
      await tx.save(ZoneRow, zone);
      await this.logbook.append(
        {
          kind: id ? 'zone.updated' : 'zone.created',
          actor,
          payload: { reservoirId, zoneId: zone.id, ...input },
        },
        tx,
      );
      return zone;
    });
    const count = await this.dataSource
      .getRepository(ContactRow)
      .countBy({ zoneId: row.id, active: true });
    return this.zoneView(row, count);
  }

  async contacts(reservoirId: string): Promise<Contact[]> {
    const zones = await this.zoneRows(reservoirId);
    const names = new Map(zones.map((z) => [z.id, z.name]));
    const rows = await this.dataSource
      .getRepository(ContactRow)
      .createQueryBuilder('c')
      .where('c.zone_id IN (:...ids)', { ids: zones.length ? zones.map((z) => z.id) : [''] })
      .getMany();
    // nearest zone first, as the zones are listed; then by place in the chain
    const rank = new Map(zones.map((z, i) => [z.id, i]));
    rows.sort(
      (a, b) =>
        rank.get(a.zoneId)! - rank.get(b.zoneId)! ||
        a.escalationOrder - b.escalationOrder ||
        a.person.localeCompare(b.person),
    );
    const usernames = new Map<string, string>();
    for (const id of new Set(rows.map((r) => r.userId).filter((u): u is string => u !== null))) {
      const user = await this.users.findById(id);
      if (user) usernames.set(id, user.username);
    }
    return rows.map((c) =>
      contactView(
        c,
        names.get(c.zoneId) ?? '',
        c.userId ? (usernames.get(c.userId) ?? null) : null,
      ),
    );
  }

  /** The contact's sign-in must be an existing stakeholder account. */
  private async checkUser(userId: string | null, field = 'userId'): Promise<void> {
    if (userId === null) return;
    const user = await this.users.findById(userId);
    if (!user || !rolesOf(user).includes('stakeholder')) {
      throw new BadRequestException([`${field}: no stakeholder account with this id`]);
    }
  }

  async saveContact(
    reservoirId: string,
    id: string | null,
    input: ContactInput,
    actor: LogbookActor | null,
  ): Promise<Contact> {
    await this.checkUser(input.userId);
    const saved = await this.transaction(async (tx) => {
      const zone = await tx.findOneBy(ZoneRow, { id: input.zoneId, reservoirId });
      if (!zone)
        throw new BadRequestException([`zoneId: no zone "${input.zoneId}" below ${reservoirId}`]);
      const now = Date.now();
      let row: ContactRow;
      if (id) {
        const found = await tx.findOneBy(ContactRow, { id });
        const foundZone = found && (await tx.findOneBy(ZoneRow, { id: found.zoneId, reservoirId }));
        if (!found || !foundZone)
          throw new NotFoundException(`No contact "${id}" below ${reservoirId}`);
        row = found;
      } else row = tx.create(ContactRow, { id: randomUUID(), createdAt: now });
      Object.assign(row, { ...input, updatedAt: now });
      await tx.save(ContactRow, row);
      await this.logbook.append(
        {
          kind: id ? 'contact.updated' : 'contact.created',
          actor,
          payload: { reservoirId, contactId: row.id, ...input },
        },
        tx,
      );
      return { row, zoneName: zone.name };
    });
    const username = saved.row.userId
      ? ((await this.users.findById(saved.row.userId))?.username ?? null)
      : null;
    return contactView(saved.row, saved.zoneName, username);
  }

  /**
   * A whole contacts file, all or nothing: a file with any problem imports no row, and every
   * problem comes back with its row and column so the liaison can fix them in one go.
   */
  async importCsv(
    reservoirId: string,
    text: string,
    actor: LogbookActor | null,
  ): Promise<ImportResult> {
    this.reservoirs.get(reservoirId);
    const parsed = parseContactsCsv(text);
    const problems = [...parsed.problems];
    const zones = await this.zoneRows(reservoirId);
    const byName = new Map(zones.map((z) => [z.name.toLowerCase(), z]));
    const resolved: ContactInput[] = [];
    for (const { row, contact } of parsed.rows) {
      const zone = byName.get(contact.zoneName.toLowerCase());
      if (!zone) {
        problems.push({
          row,
          column: 'zone',
          message: `row ${row}, column 'zone': no zone "${contact.zoneName}" (zones: ${zones.map((z) => z.name).join(', ')})`,
        });
      }
      let userId: string | null = null;
      if (contact.username) {
        const user = await this.users.findByUsername(contact.username);
        if (!user || !rolesOf(user).includes('stakeholder')) {
          problems.push({
            row,
            column: 'username',
            message: `row ${row}, column 'username': no stakeholder account "${contact.username}"`,
          });
        } else userId = user.id;
      }
      if (zone) {
        const { zoneName: _z, username: _u, ...rest } = contact;
        resolved.push({ ...rest, zoneId: zone.id, userId });
      }
    }
    problems.sort((a, b) => a.row - b.row);
    if (problems.length) return { imported: 0, problems };
    await this.transaction(async (tx) => {
      const now = Date.now();
      const ids: string[] = [];
      for (const input of resolved) {
        const row = tx.create(ContactRow, {
          ...input,
          id: randomUUID(),
          createdAt: now,
          updatedAt: now,
        });
        await tx.insert(ContactRow, row);
        ids.push(row.id);
      }
      await this.logbook.append(
        {
          kind: 'contacts.imported',
          actor,
          payload: { reservoirId, count: ids.length, contactIds: ids },
        },
        tx,
      );
    });
    return { imported: resolved.length, problems: [] };
  }
}

export function contactView(c: ContactRow, zoneName: string, username: string | null): Contact {
  return {
    id: c.id,
    zoneId: c.zoneId,
    zoneName,
    organisation: c.organisation,
    person: c.person,
    role: c.role,
    email: c.email,
    phone: c.phone,
    leadTimeS: c.leadTimeS,
    escalationOrder: c.escalationOrder,
    ackWindowS: c.ackWindowS,
    userId: c.userId,
    username,
    active: Boolean(c.active),
    updatedAt: c.updatedAt,
  };
}
