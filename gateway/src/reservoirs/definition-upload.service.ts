import { BadRequestException, Injectable } from '@nestjs/common';
import { reservoirDefinitionSchema, type ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { LogbookActor } from '../logbook/logbook.service';
import { LogbookService } from '../logbook/logbook.service';
import { checkDefinition, zodProblems } from './definition-checks';
import { ReservoirsService } from './reservoirs.service';
import { parseStorageTableCsv, type UploadProblem } from './storage-csv';

export const DEFINITION_CHANGED = 'reservoir.definition-changed';

export interface UploadResult {
  reservoirId: string;
  version: number;
  previousVersion: number | null;
  change: 'storage-table' | 'structures';
  /** usable but doubtful: the version was written, and these say what to look at */
  warnings: UploadProblem[];
}

/** The 400 of a refused upload: every problem as a line, and the same as data for a form. */
function refuse(problems: UploadProblem[]): never {
  const errors = problems.filter((p) => p.severity === 'error');
  throw new BadRequestException({
    statusCode: 400,
    error: 'Bad Request',
    message: errors.slice(0, 50).map((p) => p.message),
    problems: errors.slice(0, 200),
  });
}

/**
 * Changes to a reservoir's definition by upload. Each accepted upload is a new version (the old
 * ones stay as they were) written in one transaction with its logbook entry, so the record shows
 * who changed what, when, and which version every later forecast used.
 */
@Injectable()
export class DefinitionUploadService {
  constructor(
    private readonly reservoirs: ReservoirsService,
    private readonly logbook: LogbookService,
  ) {}

  async storageTable(
    reservoirId: string,
    csv: string,
    note: string | null,
    actor: LogbookActor,
  ): Promise<UploadResult> {
    const current = this.reservoirs.get(reservoirId);
    const parsed = parseStorageTableCsv(csv);
    if (parsed.problems.some((p) => p.severity === 'error')) refuse(parsed.problems);
    const next = { ...current.definition, storageTable: parsed.rows };
    return this.write(current.version, next, 'storage-table', note, actor, parsed.problems, {
      storageRows: parsed.rows.length,
      fromElevation: parsed.rows[0]!.elevation,
      toElevation: parsed.rows[parsed.rows.length - 1]!.elevation,
    });
  }

  async structures(
    reservoirId: string,
    body: { structures?: unknown; thresholds?: unknown },
    note: string | null,
    actor: LogbookActor,
  ): Promise<UploadResult> {
    if (body.structures === undefined && body.thresholds === undefined)
      refuse([
        {
          field: '(body)',
          row: 0,
          line: null,
          column: null,
          message: '(body): give structures, thresholds or both',
          severity: 'error',
        },
      ]);
    const current = this.reservoirs.get(reservoirId);
    const candidate = {
      ...current.definition,
      ...(body.structures !== undefined ? { structures: body.structures } : {}),
      ...(body.thresholds !== undefined ? { thresholds: body.thresholds } : {}),
    };
    const parsed = reservoirDefinitionSchema.safeParse(candidate);
    if (!parsed.success) refuse(zodProblems(parsed.error));
    const problems = checkDefinition(parsed.data);
    if (problems.some((p) => p.severity === 'error')) refuse(problems);
    return this.write(current.version, parsed.data, 'structures', note, actor, problems, {
      structures: parsed.data.structures.length,
      thresholds: parsed.data.thresholds.length,
      changed: [
        ...(body.structures !== undefined ? ['structures'] : []),
        ...(body.thresholds !== undefined ? ['thresholds'] : []),
      ],
    });
  }

  private async write(
    baseVersion: number,
    definition: ReservoirDefinition,
    change: UploadResult['change'],
    note: string | null,
    actor: LogbookActor,
    problems: UploadProblem[],
    summary: Record<string, unknown>,
  ): Promise<UploadResult> {
    const warnings = problems.filter((p) => p.severity === 'warning');
    // the whole definition is checked again: a storage table must still suit the structures
    const whole = checkDefinition(definition).filter((p) => p.severity === 'error');
    if (whole.length) refuse(whole);
    let previousVersion: number | null = null;
    const loaded = await this.reservoirs.addVersion(definition, actor.username, {
      change,
      note,
      baseVersion,
      alsoWrite: (tx, version, previous) => {
        previousVersion = previous;
        return this.logbook.append(
          {
            kind: DEFINITION_CHANGED,
            actor,
            payload: {
              reservoirId: definition.id,
              version,
              previousVersion: previous,
              change,
              note,
              ...summary,
              warnings: warnings.map((w) => w.message),
            },
          },
          tx,
        );
      },
    });
    return {
      reservoirId: definition.id,
      version: loaded.version,
      previousVersion,
      change,
      warnings,
    };
  }
}
