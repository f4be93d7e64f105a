import { useQuery } from '@tanstack/react-query';
import { reportJobSchema, type ReportJob } from '@stillwell/shared/reports';
import { apiGet } from '../../../lib/api-client';
import { reportKeys, reportsPath } from './keys';

/** How often a running job is asked for its progress. */
export const JOB_POLL_MS = 600;

export const isFinished = (job: ReportJob | undefined) =>
  job?.stage === 'done' || job?.stage === 'failed';

export function getReportJob(reservoirId: string, id: string, signal?: AbortSignal) {
  return apiGet(reportsPath(reservoirId, encodeURIComponent(id)), reportJobSchema, { signal });
}

/** The job, polled until it is done or failed. */
export function useReportJob(reservoirId: string, id: string | null) {
  return useQuery({
    queryKey: reportKeys.job(reservoirId, id ?? ''),
    queryFn: ({ signal }) => getReportJob(reservoirId, id!, signal),
    enabled: id !== null,
    refetchInterval: (query) => (isFinished(query.state.data) ? false : JOB_POLL_MS),
  });
}
