import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import LinearProgress from '@mui/material/LinearProgress';
import Typography from '@mui/material/Typography';
import { REPORT_STAGE_LABELS, type ReportJob } from '@stillwell/shared/reports';
import { formatNumber } from '../../../lib/format';

export interface ReportProgressProps {
  job: ReportJob;
}

/** The job's stage and share done, as the gateway last reported them. */
export function ReportProgress({ job }: ReportProgressProps) {
  if (job.stage === 'failed')
    return (
      <Alert severity="error" variant="outlined" data-testid="report-failed">
        <strong>The report could not be produced.</strong> {job.error ?? 'No reason was given.'}
      </Alert>
    );
  const rows = job.rows
    ? ` · ${formatNumber(job.rows.done, 0)} of ${formatNumber(job.rows.total, 0)} rows written`
    : '';
  return (
    <Box sx={{ display: 'grid', gap: 0.5 }} data-testid="report-progress" data-stage={job.stage}>
      <LinearProgress
        variant="determinate"
        value={job.percent}
        aria-label="Report progress"
        color={job.stage === 'done' ? 'success' : 'primary'}
      />
      <Typography variant="body2" color="text.secondary" data-testid="report-progress-text">
        {REPORT_STAGE_LABELS[job.stage]} · {Math.round(job.percent)}%{rows}
      </Typography>
    </Box>
  );
}
