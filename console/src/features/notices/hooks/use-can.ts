import type { Action } from '@stillwell/shared/access';
import { useSession } from '../../../lib/auth-session';

/**
 * Whether the signed-in person's roles allow an action (the shared permission matrix, as the
 * gateway sent it at sign-in). Only hides what the gateway would refuse anyway; without a console
 * session (requests authorised outside the console) everything is offered and the gateway decides.
 */
export function useCan(action: Action): boolean {
  const me = useSession()?.me;
  return me ? me.permissions.includes(action) : true;
}
