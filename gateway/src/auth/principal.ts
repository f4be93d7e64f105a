import type { Role } from '@stillwell/shared/access';
import type { LogbookActor } from '../logbook/logbook.service';

/** Who a request or socket acts for, as checked against the database on each use. */
export interface Principal {
  userId: string;
  username: string;
  displayName: string;
  roles: Role[];
  sessionId: string;
  /** epoch ms; null when the session never stepped up */
  steppedUpAt: number | null;
  totpEnabled: boolean;
  mustChangePassword: boolean;
  /** when the access token presented expires, epoch ms */
  tokenExpiresAt: number;
}

export function actorOf(p: Pick<Principal, 'userId' | 'username' | 'roles'>): LogbookActor {
  return { userId: p.userId, username: p.username, roles: [...p.roles] };
}
