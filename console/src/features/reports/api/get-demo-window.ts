import { useQuery } from '@tanstack/react-query';
import { reportWindowSchema } from '@stillwell/shared/reports';
import { apiGet } from '../../../lib/api-client';
import { reportKeys, reportsPath } from './keys';

/** The demo storm's window as the record holds it (404 until the simulator has stored readings). */
export function useDemoWindow(reservoirId: string) {
  return useQuery({
    queryKey: reportKeys.demoWindow(reservoirId),
    queryFn: ({ signal }) =>
      apiGet(reportsPath(reservoirId, 'demo-window'), reportWindowSchema, { signal }),
    retry: false,
  });
}
