import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { attachmentRefSchema, type LogbookEntry } from '@stillwell/shared/logbook';
import { describeError } from '../../../lib/api-client';
import { formatSiteTime } from '../../../lib/format';
import { downloadAttachment } from '../api/shift-log';

export interface EntryDetailProps {
  entry: LogbookEntry;
  timeZone: string;
}

/** One entry: its payload as hashed, its attachments, and its place in the chain. */
export function EntryDetail({ entry, timeZone }: EntryDetailProps) {
  const [error, setError] = useState<string | null>(null);
  const t = formatSiteTime(Date.parse(entry.time), timeZone);
  const attachments = (Array.isArray(entry.payload.attachments) ? entry.payload.attachments : [])
    .map((a) => attachmentRefSchema.safeParse(a))
    .flatMap((r) => (r.success ? [r.data] : []));
  return (
    <Box sx={{ display: 'grid', gap: 1 }} data-testid="logbook-entry-detail">
      <Typography variant="h3" component="h3">
        Entry {entry.seq}: {entry.kind}
      </Typography>
      <Typography variant="body2">
        {t.date} {t.time} {t.zone} · {entry.actorName ?? 'gateway'}{' '}
        {entry.actorRoles.length ? `(${entry.actorRoles.join(', ')})` : ''}
      </Typography>
      <Box
        component="pre"
        sx={{
          m: 0,
          p: 1,
          bgcolor: 'background.default',
          borderRadius: 1,
          overflow: 'auto',
          maxHeight: 320,
          fontSize: 12,
        }}
      >
        {JSON.stringify(entry.payload, null, 2)}
      </Box>
      {attachments.length > 0 && (
        <Box sx={{ display: 'grid', gap: 0.5 }}>
          {attachments.map((a) => (
            <Box key={a.sha256} sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
              <Button
                size="small"
                onClick={() =>
                  downloadAttachment(entry.seq, a.sha256, a.name).catch((e: unknown) =>
                    setError(describeError(e)),
                  )
                }
              >
                {a.name}
              </Button>
              <Typography variant="caption" sx={{ fontFamily: 'monospace' }}>
                {a.mediaType}, {(a.size / 1024).toFixed(1)} KiB, SHA-256 {a.sha256}
              </Typography>
            </Box>
          ))}
        </Box>
      )}
      {error && <Alert severity="error">{error}</Alert>}
      <Typography
        variant="caption"
        sx={{ fontFamily: 'monospace', wordBreak: 'break-all' }}
        color="text.secondary"
      >
        previous {entry.prevHash}
        <br />
        this {entry.hash}
      </Typography>
    </Box>
  );
}
