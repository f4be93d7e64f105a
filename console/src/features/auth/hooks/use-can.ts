import { permissionsOf, type Action } from '@stillwell/shared/access';
import { useSession } from '../../../lib/auth-session';

/**
 * May the signed-in person do this, by the shared permission matrix? The console only hides and
 * explains with it; the gateway decides. Without a console session (authorised from outside the
 * console, or a screen rendered alone) nothing is known, so nothing is hidden.
 */
export function useCan(action: Action): boolean {
  const me = useSession()?.me;
  return me ? permissionsOf(me.roles).includes(action) : true;
}
