import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { formatDistance, formatRelease, type Notice } from '@stillwell/shared/notices';
import { describeError } from '../../../lib/api-client';
import { fonts } from '../../../theme';
import { useSendNotice } from '../api/send-notice';
import { useCan } from '../hooks/use-can';
import { minutes, siteTime } from '../utils/times';
import { StandingChip } from './standing-chip';
import { WordingDialog } from './wording-dialog';

const STATE_LABELS: Record<Notice['state'], string> = {
  prepared: 'Prepared: review and send',
  sent: 'Sent',
  withdrawn: 'Withdrawn',
};

export interface NoticeCardProps {
  reservoirId: string;
  notice: Notice;
  timeZone: string;
}

/** One zone's notice: the figures, who is to be told and where each stands, review and send. */
export function NoticeCard({ reservoirId, notice, timeZone }: NoticeCardProps) {
  const [editing, setEditing] = useState(false);
  const [showText, setShowText] = useState(false);
  const send = useSendNotice(reservoirId);
  const canSend = useCan('notices.send');
  const canEdit = useCan('notices.manage');
  const t = (ms: number | null) => siteTime(ms, timeZone);
  return (
    <Paper
      variant="outlined"
      sx={{ p: 1.5 }}
      data-testid={`notice-${notice.zoneName}`}
      data-state={notice.state}
    >
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}>
        <Typography variant="h3" component="h3" sx={{ flexGrow: 1 }}>
          {notice.zoneName}{' '}
          <Typography component="span" sx={{ color: 'text.secondary' }}>
            {formatDistance(notice.distanceM)} below the dam
          </Typography>
        </Typography>
        {notice.emergency && <Chip size="small" color="warning" label="Declared emergency" />}
        <Chip size="small" variant="outlined" label={STATE_LABELS[notice.state]} />
        {notice.state === 'prepared' && canEdit && (
          <Button size="small" onClick={() => setEditing(true)}>
            Edit wording
          </Button>
        )}
        {notice.state === 'prepared' && canSend && (
          <Button
            size="small"
            variant="contained"
            disabled={send.isPending}
            onClick={() => send.mutate(notice.id)}
          >
            Send to {notice.recipients.length}{' '}
            {notice.recipients.length === 1 ? 'contact' : 'contacts'}
          </Button>
        )}
        {notice.state === 'prepared' && !canSend && (
          <Typography variant="body2" sx={{ color: 'text.secondary' }}>
            The downstream liaison or the duty engineer sends it.
          </Typography>
        )}
      </Box>
      <Box
        component="dl"
        sx={{
          display: 'grid',
          gridTemplateColumns: 'max-content 1fr',
          columnGap: 2,
          rowGap: 0.25,
          my: 1,
        }}
      >
        <dt>Expected release</dt>
        <dd style={{ margin: 0, fontFamily: fonts.mono }}>{formatRelease(notice.releaseM3s)}</dd>
        <dt>Starts at the dam</dt>
        <dd style={{ margin: 0 }}>{t(notice.startAt)}</dd>
        <dt>Arrives at the zone</dt>
        <dd style={{ margin: 0 }}>
          {t(notice.arrivalAt)} (travel {minutes(notice.travelTimeS)})
        </dd>
        <dt>Lasting</dt>
        <dd style={{ margin: 0 }}>
          {notice.durationS === null ? 'until further notice' : minutes(notice.durationS)}
        </dd>
      </Box>
      {notice.beyondTable === 'above' && (
        <Alert severity="warning" variant="outlined" sx={{ mb: 1 }}>
          This release is larger than any in the zone&apos;s travel-time table: the water may arrive
          earlier than stated.
        </Alert>
      )}
      {send.isError && <Alert severity="error">{describeError(send.error)}</Alert>}
      <Table size="small" aria-label={`Contacts for ${notice.zoneName}`}>
        <TableHead>
          <TableRow>
            <TableCell>Contact</TableCell>
            <TableCell>Standing</TableCell>
            <TableCell>Mail accepted</TableCell>
            <TableCell>Answer due</TableCell>
            <TableCell>Lead time runs out</TableCell>
            <TableCell>Acknowledged</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {notice.recipients.map((r) => (
            <TableRow key={r.id} data-testid={`recipient-${r.person}`} data-standing={r.standing}>
              <TableCell>
                {r.person}, {r.role}, {r.organisation}
                {r.reason === 'escalation' && ' (escalated to)'}
                <Typography variant="body2" sx={{ color: 'text.secondary' }}>
                  {r.phone} · {r.email}
                </Typography>
              </TableCell>
              <TableCell>
                <StandingChip standing={r.standing} />
                {r.bounceReason && (
                  <Typography variant="body2" sx={{ color: 'text.secondary' }}>
                    {r.bounceReason}
                  </Typography>
                )}
              </TableCell>
              <TableCell>{t(r.deliveredAt)}</TableCell>
              <TableCell>{t(r.ackDueAt)}</TableCell>
              <TableCell>{t(r.leadTimeRunsAt)}</TableCell>
              <TableCell>{t(r.acknowledgedAt)}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
      <Button size="small" onClick={() => setShowText((v) => !v)} sx={{ mt: 1 }}>
        {showText ? 'Hide the message' : 'Show the message'}
      </Button>
      {showText && (
        <Box
          component="pre"
          sx={{ whiteSpace: 'pre-wrap', fontFamily: fonts.mono, fontSize: 13, m: 0 }}
        >
          {notice.preview}
        </Box>
      )}
      {editing && (
        <WordingDialog
          reservoirId={reservoirId}
          notice={notice}
          onClose={() => setEditing(false)}
        />
      )}
    </Paper>
  );
}
