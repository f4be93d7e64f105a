import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import GlobalStyles from '@mui/material/GlobalStyles';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import { describeError } from '../../../lib/api-client';
import { formatSiteTime } from '../../../lib/format';
import { useHead, useLastVerification, useVerifyNow } from '../api/chain';

/** Printing the logbook screen prints the chain panel alone: the head hash on paper. */
const PRINT = {
  '@media print': {
    'body *': { visibility: 'hidden' },
    '.stillwell-printable, .stillwell-printable *': { visibility: 'visible', color: '#000' },
    '.stillwell-printable': { position: 'absolute', left: 0, top: 0, width: '100%' },
    '.stillwell-no-print': { display: 'none' },
  },
} as const;

export interface ChainPanelProps {
  timeZone: string;
  /** the printable sheet of the head */
  printHref: string;
}

/**
 * The chain's state and its head hash, large and printable: a reviewer who keeps the printed head
 * can prove later that no entry before it was changed (verify with that head).
 */
export function ChainPanel({ timeZone, printHref }: ChainPanelProps) {
  const head = useHead();
  const last = useLastVerification();
  const verify = useVerifyNow();
  const report = verify.data ?? last.data ?? null;
  const at = (iso: string) => {
    const t = formatSiteTime(Date.parse(iso), timeZone);
    return `${t.date} ${t.time} ${t.zone}`;
  };
  const problem =
    report && !report.ok
      ? (report.firstBad?.detail ??
        report.attachments?.bad[0]?.detail ??
        'the chain does not verify')
      : null;
  return (
    <Box
      sx={{ display: 'grid', gap: 1 }}
      className="stillwell-printable"
      data-testid="logbook-chain"
    >
      <GlobalStyles styles={PRINT} />
      {report ? (
        <Alert
          severity={report.ok ? 'success' : 'error'}
          data-testid="logbook-chain-state"
          data-ok={String(report.ok)}
        >
          {report.ok
            ? `Chain verified: ${report.count} entries${report.attachments ? ` and ${report.attachments.checked} attachments` : ''} intact (checked ${at(report.checkedAt)}).`
            : `Chain broken: ${problem}`}
        </Alert>
      ) : (
        <Alert severity="info">Not verified yet.</Alert>
      )}
      <Typography variant="body2" color="text.secondary">
        Published head{' '}
        {head.data?.seq !== null && head.data
          ? `(entry ${head.data.seq}, ${head.data.time ? at(head.data.time) : ''})`
          : ''}
      </Typography>
      <Typography
        data-testid="logbook-head-hash"
        sx={{ fontFamily: 'monospace', fontSize: 18, wordBreak: 'break-all' }}
      >
        {head.data?.hash ?? 'the logbook is empty'}
      </Typography>
      <Box sx={{ display: 'flex', gap: 1 }} className="stillwell-no-print">
        <Button
          variant="contained"
          onClick={() => verify.mutate()}
          disabled={verify.isPending}
          data-testid="logbook-verify"
        >
          Verify now
        </Button>
        <Button onClick={() => window.print()}>Print the head</Button>
        <Button component={RouterLink} to={printHref} data-testid="logbook-head-sheet-link">
          Sheet to print and keep
        </Button>
      </Box>
      {verify.isError && <Alert severity="error">{describeError(verify.error)}</Alert>}
    </Box>
  );
}
