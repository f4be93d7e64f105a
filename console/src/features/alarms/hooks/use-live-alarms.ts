import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useLiveSocket } from '../../../lib/live-connection';
import { startAlarmsSync } from '../live/alarms-sync';

/**
 * Keeps a reservoir's alarm list live while mounted (mount it once per reservoir: leaving
 * unsubscribes the room). Returns the live feed's problem, if any.
 */
export function useLiveAlarms(reservoirId: string): string | null {
  const socket = useLiveSocket();
  const queryClient = useQueryClient();
  const [issue, setIssue] = useState<string | null>(null);
  useEffect(
    () => startAlarmsSync({ socket, queryClient, reservoirId, onIssue: setIssue }),
    [socket, queryClient, reservoirId],
  );
  return issue;
}
