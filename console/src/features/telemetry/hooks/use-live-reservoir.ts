import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { STATUS_POLL_MS } from '../../../config/display';
import { useLiveConnectionState, useLiveSocket } from '../../../lib/live-connection';
import { reservoirStatusQueryKey } from '../api/get-reservoir-status';
import { startLiveSync } from '../live/live-sync';

/**
 * Keeps one reservoir's status and readings live in the query cache while mounted. Returns the
 * latest problem with the live feed, if any, for the screen to show.
 */
export function useLiveReservoir(reservoirId: string): { issue: string | null } {
  const socket = useLiveSocket();
  const queryClient = useQueryClient();
  const connection = useLiveConnectionState();
  const [issue, setIssue] = useState<string | null>(null);

  useEffect(
    () => startLiveSync({ socket, queryClient, reservoirId, onIssue: setIssue }),
    [socket, queryClient, reservoirId],
  );

  useEffect(() => {
    if (connection === 'connected') return undefined;
    // Without pushes the numbers would freeze; plain HTTP may still get through.
    const id = window.setInterval(() => {
      void queryClient.invalidateQueries({ queryKey: reservoirStatusQueryKey(reservoirId) });
    }, STATUS_POLL_MS);
    return () => window.clearInterval(id);
  }, [connection, queryClient, reservoirId]);

  return { issue };
}
