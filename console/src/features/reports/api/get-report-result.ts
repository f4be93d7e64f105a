import { useQuery } from '@tanstack/react-query';
import { eventReportSchema, type ReportFormat } from '@stillwell/shared/reports';
import { apiDownload, apiGet } from '../../../lib/api-client';
import { reportKeys, reportsPath } from './keys';

const resultPath = (reservoirId: string, id: string) =>
  reportsPath(reservoirId, `${encodeURIComponent(id)}/result`);

/** The finished report's figures (its JSON result), to show on the page. */
export function useReportResult(reservoirId: string, id: string | null, ready: boolean) {
  return useQuery({
    queryKey: reportKeys.result(reservoirId, id ?? ''),
    queryFn: ({ signal }) =>
      apiGet(resultPath(reservoirId, id!), eventReportSchema, {
        signal,
        query: { format: 'json' },
      }),
    enabled: id !== null && ready,
    // a finished report never changes
    staleTime: Infinity,
  });
}

/**
 * Downloads one result with the access token (a plain link would carry none) and hands it to the
 * browser as a file under the name the gateway gave it.
 */
export async function downloadReport(
  reservoirId: string,
  id: string,
  format: ReportFormat,
): Promise<void> {
  const { blob, filename } = await apiDownload(resultPath(reservoirId, id), {
    query: { format },
  });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename ?? `report.${format}`;
  document.body.append(a);
  a.click();
  a.remove();
  // revoked after the click has been handled, or some browsers lose the file
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}
