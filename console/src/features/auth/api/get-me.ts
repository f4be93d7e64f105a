import { meSchema, type Me } from '@stillwell/shared/access';
import { apiGet } from '../../../lib/api-client';
import { updateMe } from '../../../lib/auth-session';

/** Reads who is signed in afresh and hands it to the session (after a change to the account). */
export async function reloadMe(): Promise<Me> {
  const me = await apiGet('/api/auth/me', meSchema);
  updateMe(me);
  return me;
}
