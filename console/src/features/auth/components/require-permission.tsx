import type { ReactNode } from 'react';
import type { Action } from '@stillwell/shared/access';
import { useCan } from '../hooks/use-can';
import { NotAllowed } from './not-allowed';

export interface RequirePermissionProps {
  action: Action;
  children: ReactNode;
}

/** A route guard: the screen only for roles the shared matrix allows; the rest see why not. */
export function RequirePermission({ action, children }: RequirePermissionProps) {
  return useCan(action) ? <>{children}</> : <NotAllowed action={action} />;
}
