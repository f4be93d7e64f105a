import { randomUUID } from 'node:crypto';
import { Injectable, Logger, OnApplicationBootstrap } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { IsNull } from 'typeorm';
import { DEMO_CONTACTS, DEMO_ZONES } from '@stillwell/shared/notices';
import { DEMO_RESERVOIR } from '@stillwell/shared/reservoirs';
import type { Env } from '../../config';
import { LogbookService } from '../../logbook/logbook.service';
import { UsersService } from '../../users/users.service';
import { ContactRow } from '../contact.entity';
import { RegistryService } from '../registry.service';
import { ZoneRow } from '../zone.entity';

/**
 * Demo mode: the invented zones below Orrin Gap Dam and the invented people to tell, seeded once
 * into an empty registry. Hessford's duty officer is linked to the demo stakeholder account.
 */
@Injectable()
export class DemoRegistrySeeder implements OnApplicationBootstrap {
  private readonly logger = new Logger('DemoRegistry');

  constructor(
    private readonly config: ConfigService<Env, true>,
    private readonly registry: RegistryService,
    private readonly users: UsersService,
    private readonly logbook: LogbookService,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    if (!this.config.get('DEMO_MODE', { infer: true })) return;
    const reservoirId = DEMO_RESERVOIR.id;
    const userIds = new Map<string, string>();
    for (const name of new Set(
      DEMO_CONTACTS.map((c) => c.username).filter((u): u is string => u !== null),
    )) {
      const user = await this.users.findByUsername(name);
      if (user) userIds.set(name, user.id);
    }
    if ((await this.registry.zoneRows(reservoirId)).length > 0) return this.relink(userIds);
    await this.registry.transaction(async (tx) => {
      const now = Date.now();
      const ids = new Map<string, string>();
      for (const { key, travelTimes, ...zone } of DEMO_ZONES) {
        const id = randomUUID();
        ids.set(key, id);
        await tx.insert(ZoneRow, {
          ...zone,
          id,
          reservoirId,
          travelTimes: JSON.stringify(travelTimes),
          createdAt: now,
          updatedAt: now,
        });
      }
      for (const { zone, username, ...contact } of DEMO_CONTACTS) {
        await tx.insert(ContactRow, {
          ...contact,
          id: randomUUID(),
          zoneId: ids.get(zone)!,
          userId: username ? (userIds.get(username) ?? null) : null,
          createdAt: now,
          updatedAt: now,
        });
      }
      await this.logbook.append(
        {
          kind: 'contacts.imported',
          actor: null,
          payload: {
            reservoirId,
            via: 'demo-seed',
            zones: DEMO_ZONES.length,
            count: DEMO_CONTACTS.length,
          },
        },
        tx,
      );
    });
    this.logger.log(
      `Seeded ${DEMO_ZONES.length} demo zones and ${DEMO_CONTACTS.length} contacts below ${DEMO_RESERVOIR.damName}`,
    );
  }

  /** A demo contact left without its sign-in (the account came later) gets it at the next start. */
  private async relink(userIds: ReadonlyMap<string, string>): Promise<void> {
    await this.registry.transaction(async (tx) => {
      for (const c of DEMO_CONTACTS) {
        const userId = c.username ? userIds.get(c.username) : undefined;
        if (userId) await tx.update(ContactRow, { email: c.email, userId: IsNull() }, { userId });
      }
    });
  }
}
