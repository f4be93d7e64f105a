import { ConflictException, Injectable } from '@nestjs/common';
import {
  applyLimitsChange,
  type LimitsChange,
  type LimitsChangeResult,
} from '@stillwell/shared/reservoirs';
import type { LogbookActor } from '../logbook/logbook.service';
import { LogbookService } from '../logbook/logbook.service';
import { DEFINITION_CHANGED } from './definition-upload.service';
import { refuseLimits } from './limits-change.pipe';
import { ReservoirsService } from './reservoirs.service';

/**
 * An engineer's change of limits (alarm limits, alert levels, instrument thresholds and
 * baselines): a new version of the definition, written in one transaction with its logbook entry
 * listing every field from/to, as every definition upload is. The alarm engine rebuilds on the
 * new version (ReservoirsService.changed$).
 */
@Injectable()
export class LimitsChangeService {
  constructor(
    private readonly reservoirs: ReservoirsService,
    private readonly logbook: LogbookService,
  ) {}

  async change(
    reservoirId: string,
    change: LimitsChange,
    actor: LogbookActor,
  ): Promise<LimitsChangeResult> {
    const current = this.reservoirs.get(reservoirId);
    // the change was made looking at another version: its from-values may not hold any more
    if (change.baseVersion !== current.version)
      throw new ConflictException(
        `the definition changed meanwhile (now version ${current.version}, the change was made on ${change.baseVersion}): load it again and repeat the change`,
      );
    const outcome = applyLimitsChange(current.definition, change);
    if (!outcome.ok) refuseLimits(outcome.problems);
    const { definition, changes } = outcome;
    const note = change.note;
    let previousVersion: number | null = null;
    // addVersion checks baseVersion again inside the transaction: a change racing this one loses
    const loaded = await this.reservoirs.addVersion(definition, actor.username, {
      change: 'limits',
      note,
      baseVersion: change.baseVersion,
      alsoWrite: (tx, version, previous) => {
        previousVersion = previous;
        return this.logbook.append(
          {
            kind: DEFINITION_CHANGED,
            actor,
            payload: {
              reservoirId,
              version,
              previousVersion: previous,
              change: 'limits',
              note,
              changes,
            },
          },
          tx,
        );
      },
    });
    return {
      reservoirId,
      version: loaded.version,
      previousVersion,
      change: 'limits',
      changes,
    };
  }
}
