import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import type { ReportFormat, ReportJob } from '@stillwell/shared/reports';
import { describeError } from '../../../lib/api-client';
import { downloadReport } from '../api/get-report-result';

const LABEL: Record<ReportFormat, string> = {
  pdf: 'Download PDF',
  json: 'Download JSON',
  csv: 'Download CSV',
};

export interface ReportDownloadsProps {
  job: ReportJob;
}

/** One button per format the job built; each fetches with the session's token. */
export function ReportDownloads({ job }: ReportDownloadsProps) {
  const [busy, setBusy] = useState<ReportFormat | null>(null);
  const [error, setError] = useState<string | null>(null);
  const get = async (format: ReportFormat) => {
    setBusy(format);
    setError(null);
    try {
      await downloadReport(job.reservoirId, job.id, format);
    } catch (e) {
      setError(describeError(e));
    } finally {
      setBusy(null);
    }
  };
  return (
    <Box sx={{ display: 'grid', gap: 1 }}>
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }}>
        {job.formats.map((f) => (
          <Button
            key={f}
            variant="outlined"
            disabled={busy !== null}
            onClick={() => void get(f)}
            data-testid={`report-download-${f}`}
          >
            {busy === f ? 'Downloading…' : LABEL[f]}
          </Button>
        ))}
      </Box>
      {error && (
        <Alert severity="error" variant="outlined">
          <strong>The download failed.</strong> {error}
        </Alert>
      )}
    </Box>
  );
}
