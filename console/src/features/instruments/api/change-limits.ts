import {
  limitsChangeResultSchema,
  type LimitsChange,
  type LimitsChangeResult,
} from '@stillwell/shared/reservoirs';
import { apiPost } from '../../../lib/api-client';

/** A new version of the definition with these limits; 409 when another change came first. */
export function postLimitsChange(
  reservoirId: string,
  change: LimitsChange,
): Promise<LimitsChangeResult> {
  return apiPost(
    `/api/reservoirs/${encodeURIComponent(reservoirId)}/definition/limits`,
    change,
    limitsChangeResultSchema,
  );
}
