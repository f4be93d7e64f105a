import { useEffect, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { useLiveSocket } from '../../../lib/live-connection';
import { startForecastSync } from '../live/forecast-sync';

/** Keeps one reservoir's latest forecast live in the query cache while mounted. */
export function useLiveForecast(reservoirId: string): { issue: string | null } {
  const socket = useLiveSocket();
  const queryClient = useQueryClient();
  const [issue, setIssue] = useState<string | null>(null);
  useEffect(
    () => startForecastSync({ socket, queryClient, reservoirId, onIssue: setIssue }),
    [socket, queryClient, reservoirId],
  );
  return { issue };
}
