import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { useSearchParams } from 'react-router-dom';
import { REPORT_CAUTION } from '@stillwell/shared/reports';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useCreateReport } from '../api/create-report';
import { useReportJob } from '../api/get-report-job';
import { useReportResult } from '../api/get-report-result';
import { siteMoment } from '../utils/report-text';
import { ReportDetails } from './report-details';
import { ReportDownloads } from './report-downloads';
import { ReportProgress } from './report-progress';
import { ReportSummary } from './report-summary';
import { ReportWindowForm } from './report-window-form';

export interface ReportsScreenProps {
  definition: ReservoirDefinition;
}

/** Event reports: choose a window, watch the job, read the figures, take the files away. */
export function ReportsScreen({ definition }: ReportsScreenProps) {
  const reservoirId = definition.id;
  const timeZone = definition.timeZone;
  // the job in the address, so a reload finds it again while the gateway keeps it
  const [params, setParams] = useSearchParams();
  const jobId = params.get('job');
  const create = useCreateReport(reservoirId);
  const job = useReportJob(reservoirId, jobId);
  const done = job.data?.stage === 'done';
  const result = useReportResult(reservoirId, jobId, done && !!job.data?.formats.includes('json'));

  return (
    <Box sx={{ display: 'grid', gap: 2 }} data-testid="reports-screen">
      <title>{`Reports · ${definition.name} · Stillwell`}</title>
      <Alert severity="warning" variant="outlined" data-testid="report-caution">
        {REPORT_CAUTION}
      </Alert>
      <Panel title="Event report">
        <ReportWindowForm
          reservoirId={reservoirId}
          timeZone={timeZone}
          busy={
            create.isPending || (job.data !== undefined && !done && job.data.stage !== 'failed')
          }
          onStart={(request) =>
            create.mutate(request, {
              onSuccess: (created) => setParams({ job: created.id }),
            })
          }
        />
        {create.isError && (
          <Alert severity="error" variant="outlined" sx={{ mt: 1.5 }} data-testid="report-error">
            <strong>The report was not started.</strong> {describeError(create.error)}
          </Alert>
        )}
      </Panel>
      {jobId && (
        <Panel
          title="Progress"
          aside={
            job.data && (
              <Typography variant="caption" color="text.secondary">
                {siteMoment(Date.parse(job.data.from), timeZone)} to{' '}
                {siteMoment(Date.parse(job.data.to), timeZone)}
              </Typography>
            )
          }
        >
          {job.isPending && <LoadingMessage label="Asking for the report…" />}
          {job.isError && (
            <ErrorMessage
              title="The report job is not available."
              detail={describeError(job.error)}
            />
          )}
          {job.data && <ReportProgress job={job.data} />}
          {job.data && done && (
            <Box sx={{ mt: 1.5 }}>
              <ReportDownloads job={job.data} />
            </Box>
          )}
        </Panel>
      )}
      {result.isError && (
        <ErrorMessage
          title="The report's figures could not be loaded."
          detail={describeError(result.error)}
        />
      )}
      {result.data && (
        <>
          <ReportSummary report={result.data} timeZone={timeZone} />
          <ReportDetails report={result.data} timeZone={timeZone} />
        </>
      )}
    </Box>
  );
}
