import {
  ConflictException,
  Injectable,
  Logger,
  NotFoundException,
  OnApplicationBootstrap,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectRepository } from '@nestjs/typeorm';
import { Subject } from 'rxjs';
import { Repository, type EntityManager } from 'typeorm';
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

/** What a new version is, and what to write with it in the same transaction (the logbook). */
export interface VersionMeta {
  change: string;
  note?: string | null;
  /** the version the change was made on: refused (409) if another change came first */
  baseVersion?: number;
  /** runs inside the version's transaction; a failure rolls the version back */
  alsoWrite?: (tx: EntityManager, version: number, previous: number | null) => Promise<unknown>;
}

/** A version of a definition as the version list shows it (the definition itself apart). */
export interface VersionSummary {
  version: number;
  createdAt: string;
  createdBy: string;
  change: string | null;
  note: string | null;
  current: boolean;
  storageRows: number;
  structures: number;
  thresholds: number;
}

export interface DefinitionChanged {
  reservoirId: string;
  version: number;
  change: string;
}

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
  /** every new version after it is committed (forecasts rerun on it) */
  readonly changed$ = new Subject<DefinitionChanged>();

  constructor(
    @InjectRepository(Reservoir) private readonly reservoirs: Repository<Reservoir>,
    @InjectRepository(ReservoirVersion) private readonly versions: Repository<ReservoirVersion>,
    private readonly writes: WriteQueueService,
    private readonly config: ConfigService<Env, true>,
  ) {}

  async onApplicationBootstrap(): Promise<void> {
    if (this.config.get('DEMO_MODE', { infer: true }) && (await this.reservoirs.count()) === 0) {
      await this.addVersion(DEMO_RESERVOIR, 'seed', { change: 'seed' });
      this.logger.log(`Seeded the demo reservoir "${DEMO_RESERVOIR.name}"`);
    }
    await this.reload();
  }

  /**
   * Writes a new version of a definition (the first one creates the reservoir). Versions are
   * never overwritten: every change is a new row, and the reservoir points at the latest.
   */
  async addVersion(
    definition: ReservoirDefinition,
    createdBy: string,
    meta: VersionMeta = { change: 'definition' },
  ): Promise<LoadedReservoir> {
    const checked = reservoirDefinitionSchema.parse(definition);
    const version = await this.writes.run(() =>
      this.reservoirs.manager.transaction(async (tx) => {
        const existing = await tx.findOneBy(Reservoir, { id: checked.id });
        if (meta.baseVersion !== undefined && existing?.currentVersion !== meta.baseVersion) {
          throw new ConflictException(
            `the definition changed meanwhile (now version ${existing?.currentVersion ?? 'none'}, the change was made on ${meta.baseVersion}): load it again and repeat the change`,
          );
        }
        const next = (existing?.currentVersion ?? 0) + 1;
        await tx.insert(ReservoirVersion, {
          reservoirId: checked.id,
          version: next,
          definition: JSON.stringify(checked),
          createdAt: Date.now(),
          createdBy,
          change: meta.change,
          note: meta.note ?? null,
        });
        await meta.alsoWrite?.(tx, next, existing?.currentVersion ?? null);
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
    const loaded = this.remember(checked, version);
    this.changed$.next({ reservoirId: checked.id, version, change: meta.change });
    return loaded;
  }

  /** Every version of a reservoir's definition, newest first. */
  async listVersions(id: string): Promise<VersionSummary[]> {
    const current = this.get(id).version;
    const rows = await this.versions.find({
      where: { reservoirId: id },
      order: { version: 'DESC' },
    });
    return rows.map((r) => {
      const d = JSON.parse(r.definition) as ReservoirDefinition;
      return {
        version: r.version,
        createdAt: new Date(r.createdAt).toISOString(),
        createdBy: r.createdBy,
        change: r.change,
        note: r.note,
        current: r.version === current,
        storageRows: d.storageTable.length,
        structures: d.structures.length,
        thresholds: d.thresholds.length,
      };
    });
  }

  /** One version's definition, as it was written. */
  async getVersion(
    id: string,
    version: number,
  ): Promise<{ version: number; definition: ReservoirDefinition }> {
    this.get(id);
    const row = await this.versions.findOneBy({ reservoirId: id, version });
    if (!row) throw new NotFoundException(`Reservoir "${id}" has no version ${version}`);
    return { version, definition: reservoirDefinitionSchema.parse(JSON.parse(row.definition)) };
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
