import { useEffect, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { OrderAlarm } from '@stillwell/shared/orders';
import { useLiveSocket } from '../../../lib/live-connection';
import { ordersKeys } from '../api/keys';
import { startOrdersSync } from '../live/orders-sync';

/** Keeps a reservoir's orders live while mounted; returns the live feed's problem and the alarms. */
export function useLiveOrders(reservoirId: string): { issue: string | null; alarms: OrderAlarm[] } {
  const socket = useLiveSocket();
  const queryClient = useQueryClient();
  const [issue, setIssue] = useState<string | null>(null);
  useEffect(
    () => startOrdersSync({ socket, queryClient, reservoirId, onIssue: setIssue }),
    [socket, queryClient, reservoirId],
  );
  const alarms = useQuery({
    queryKey: ordersKeys.alarms(reservoirId),
    queryFn: () => [] as OrderAlarm[],
    staleTime: Infinity,
    gcTime: Infinity,
  });
  return { issue, alarms: alarms.data ?? [] };
}
