import { stepUpResponseSchema, type StepUpRequest } from '@stillwell/shared/access';
import { apiPost } from '../../../lib/api-client';
import { session, updateMe } from '../../../lib/auth-session';

/** Password (and code) again; authorising routes accept this session for a few minutes after. */
export async function stepUp(body: StepUpRequest): Promise<void> {
  const { stepUpUntil } = await apiPost('/api/auth/step-up', body, stepUpResponseSchema);
  const me = session()?.me;
  if (me) updateMe({ ...me, stepUpUntil });
}
