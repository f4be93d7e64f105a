import { useMutation } from '@tanstack/react-query';
import {
  reportJobSchema,
  type CreateReportRequest,
  type ReportJob,
} from '@stillwell/shared/reports';
import { apiPost } from '../../../lib/api-client';
import { reportsPath } from './keys';

export function createReport(
  reservoirId: string,
  request: CreateReportRequest,
): Promise<ReportJob> {
  return apiPost(reportsPath(reservoirId), request, reportJobSchema);
}

/** Starts a report job; the gateway answers at once and builds it behind. */
export function useCreateReport(reservoirId: string) {
  return useMutation({
    mutationFn: (request: CreateReportRequest) => createReport(reservoirId, request),
  });
}
