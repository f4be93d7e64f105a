import { useQuery } from '@tanstack/react-query';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import GlobalStyles from '@mui/material/GlobalStyles';
import Typography from '@mui/material/Typography';
import type { LogbookHead, VerificationReport } from '@stillwell/shared/logbook';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { formatSiteTime } from '../../../lib/format';
import { getHeadQueryOptions, useLastVerification } from '../api/chain';

/** On paper: black on white, no buttons. */
const PRINT = {
  '@media print': {
    body: { background: '#fff' },
    '.stillwell-no-print': { display: 'none' },
    '.stillwell-head-sheet, .stillwell-head-sheet *': { color: '#000' },
  },
} as const;

/** The hash in groups of eight, so that two people can read it to each other and compare. */
export function groupHash(hash: string): string {
  return hash.match(/.{1,8}/g)?.join(' ') ?? hash;
}

export interface HeadPrintPageProps {
  damName: string;
  timeZone: string;
}

/**
 * A sheet to print and keep: the logbook's head (last entry and its hash) as published now. Whoever
 * keeps it can later prove that no entry up to it was changed or removed, by verifying against it.
 */
export function HeadPrintPage({ damName, timeZone }: HeadPrintPageProps) {
  // the head as it is now, never a cached one: this is what goes on paper
  const head = useQuery({ ...getHeadQueryOptions(), staleTime: 0, refetchOnMount: 'always' });
  const last = useLastVerification();
  if (head.isPending) return <LoadingMessage label="Reading the logbook head…" />;
  if (head.isError)
    return (
      <ErrorMessage
        title="The logbook head could not be read."
        detail={describeError(head.error)}
      />
    );
  return (
    <HeadSheet
      damName={damName}
      timeZone={timeZone}
      head={head.data}
      verification={last.data ?? null}
      readAt={head.dataUpdatedAt}
    />
  );
}

export interface HeadSheetProps extends HeadPrintPageProps {
  head: LogbookHead;
  verification: VerificationReport | null;
  /** when the gateway was asked for this head (wall clock, epoch ms) */
  readAt: number;
}

export function HeadSheet({ damName, timeZone, head, verification, readAt }: HeadSheetProps) {
  const at = (ms: number) => {
    const t = formatSiteTime(ms, timeZone);
    return `${t.date} ${t.time} ${t.zone} (${new Date(ms).toISOString()})`;
  };
  const verifyPath =
    head.seq !== null && head.hash
      ? `/api/logbook/verify?headSeq=${head.seq}&headHash=${head.hash}`
      : null;
  return (
    <Box
      className="stillwell-head-sheet"
      data-testid="logbook-head-sheet"
      sx={{ maxWidth: 900, mx: 'auto', p: 4, display: 'grid', gap: 2, bgcolor: '#fff' }}
    >
      <GlobalStyles styles={PRINT} />
      <Typography variant="h1" component="h1" sx={{ fontSize: 26, color: '#000' }}>
        Logbook head of {damName}
      </Typography>
      {head.seq === null || !head.hash ? (
        <Typography>The logbook is empty: there is no head to print yet.</Typography>
      ) : (
        <>
          <Typography sx={{ color: '#000' }}>
            Entry <strong data-testid="logbook-head-seq">{head.seq}</strong>
            {head.time ? `, recorded ${at(Date.parse(head.time))}` : ''}
          </Typography>
          <Box>
            <Typography variant="body2" sx={{ color: '#000' }}>
              SHA-256 head hash
            </Typography>
            <Typography
              data-testid="logbook-head-sheet-hash"
              data-hash={head.hash}
              sx={{ fontFamily: 'monospace', fontSize: 22, wordBreak: 'break-all', color: '#000' }}
            >
              {groupHash(head.hash)}
            </Typography>
          </Box>
          <Typography variant="body2" sx={{ color: '#000' }}>
            {verification
              ? verification.ok
                ? `Last verification: ${verification.count} entries intact (${at(Date.parse(verification.checkedAt))}).`
                : `Last verification FAILED (${at(Date.parse(verification.checkedAt))}): ${verification.firstBad?.detail ?? 'see the logbook'}.`
              : 'Not verified yet.'}
          </Typography>
          <Typography variant="body2" sx={{ color: '#000' }}>
            To check later that no entry up to this one was changed or removed, verify the logbook
            against this head: <code>{verifyPath}</code>. Each entry is SHA-256 over its RFC 8785
            canonical JSON, including the hash of the entry before it.
          </Typography>
        </>
      )}
      <Typography variant="body2" sx={{ color: '#000' }}>
        Head read from the gateway {at(readAt)}
      </Typography>
      <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 4, mt: 4, color: '#000' }}>
        <Typography sx={{ borderTop: '1px solid #000', pt: 0.5 }}>
          Printed by (name, sign)
        </Typography>
        <Typography sx={{ borderTop: '1px solid #000', pt: 0.5 }}>
          Witnessed by (name, sign)
        </Typography>
      </Box>
      <Box className="stillwell-no-print">
        <Button variant="contained" onClick={() => window.print()} data-testid="head-sheet-print">
          Print this sheet
        </Button>
      </Box>
    </Box>
  );
}
