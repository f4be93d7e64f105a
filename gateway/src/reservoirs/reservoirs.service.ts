import { Injectable, Logger, NotFoundException, OnApplicationBootstrap } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import {
  DEMO_RESERVOIR,
  reservoirDefinitionSchema,
  type ChannelDefinition,
  type ReservoirDefinition,
} from '@stillwell/shared/reservoirs';
import type { ReservoirSummary } from '@stillwell/shared/telemetry';
import type { Env } from '../config';
import { WriteQueueService } from '../database/write-queue.service';
import { Reservoir } from './reservoir.entity';
import { ReservoirVersion } from './reservoir-version.entity';

export interface LoadedReservoir {
  version: number;
  definition: ReservoirDefinition;
  channels: ReadonlyMap<string, ChannelDefinition>;
}

/** Holds every reservoir's current definition in memory; ingestion looks channels up on each message. */
@Injectable()
export class ReservoirsService implements OnApplicationBootstrap {
  private readonly logger = new Logger(ReservoirsService.name);
  private readonly loaded = new Map<string, LoadedReservoir>();

  constructor(
    @InjectRepository(Reservoir) private readonly reservoirs: Repository<Reservoir>,
    @InjectRepository(ReservoirVersion) private readonly versions: Repository<ReservoirVersion>,
    private readonly writes: WriteQueueService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    if (this.config.get('DEMO_MODE', { infer: true }) && (await this.reservoirs.count()) === 0) {
      await this.addVersion(DEMO_RESERVOIR, 'seed');
      this.logger.log(`Seeded the demo reservoir "${DEMO_RESERVOIR.name}"`);
    }
    await this.reload();
  }

  /** Writes a new version of a definition (the first one creates the reservoir). */
  async addVersion(definition: ReservoirDefinition, createdBy: string): Promise<LoadedReservoir> {
    const checked = reservoirDefinitionSchema.parse(definition);
    const version = await this.writes.run(() =>
      this.reservoirs.manager.transaction(async (tx) => {
        const existing = await tx.findOneBy(Reservoir, { id: checked.id });
        const next = (existing?.currentVersion ?? 0) + 1;
        await tx.insert(ReservoirVersion, {
          reservoirId: checked.id,
          version: next,
          definition: JSON.stringify(checked),
          createdAt: Date.now(),
          createdBy,
        });
        await tx.save(Reservoir, {
          id: checked.id,
          name: checked.name,
          damName: checked.damName,
          timeZone: checked.timeZone,
          currentVersion: next,
        });
        return next;
      }),
    );
    return this.remember(checked, version);
  }

  list(): ReservoirSummary[] {
    return [...this.loaded.values()].map(({ version, definition: d }) => ({
      id: d.id,
      name: d.name,
      damName: d.damName,
      timeZone: d.timeZone,
      version,
    }));
  }

  /** The reservoir or undefined: for hot paths that must not throw. */
  find(id: string): LoadedReservoir | undefined {
    return this.loaded.get(id);
  }

  get(id: string): LoadedReservoir {
    const found = this.loaded.get(id);
    if (!found) throw new NotFoundException(`No reservoir "${id}"`);
    return found;
  }

  private async reload(): Promise<void> {
    for (const reservoir of await this.reservoirs.find()) {
      const row = await this.versions.findOneByOrFail({
        reservoirId: reservoir.id,
        version: reservoir.currentVersion,
      });
      this.remember(reservoirDefinitionSchema.parse(JSON.parse(row.definition)), row.version);
    }
  }

  private remember(definition: ReservoirDefinition, version: number): LoadedReservoir {
    const entry = {
      version,
      definition,
      channels: new Map(definition.channels.map((c) => [c.id, c])),
    };
    this.loaded.set(definition.id, entry);
    return entry;
  }
}
