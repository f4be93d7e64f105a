import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  COMMENT_MAX,
  MIN_REASON_LENGTH,
  SHELVE_CHOICES_S,
  type AlarmView,
} from '@stillwell/shared/alarms';
import { describeError } from '../../../lib/api-client';
import { useAlarmAction, type AlarmActionRequest } from '../api/alarm-actions';

export type DialogAction = AlarmActionRequest['action'];

export interface AlarmActionDialogProps {
  reservoirId: string;
  alarm: AlarmView;
  action: DialogAction;
  onClose: () => void;
}

const TITLE: Record<DialogAction, string> = {
  acknowledge: 'Acknowledge',
  shelve: 'Shelve',
  'out-of-service': 'Take out of service',
  'return-to-service': 'Return to service',
};

const hoursText = (s: number) =>
  s < 3600 ? `${s / 60} minutes` : `${s / 3600} hour${s === 3600 ? '' : 's'}`;

/** One action on one alarm: a comment, or a reason (and a shelf length) where one is required. */
export function AlarmActionDialog({ reservoirId, alarm, action, onClose }: AlarmActionDialogProps) {
  const [text, setText] = useState('');
  const [durationS, setDurationS] = useState<number>(SHELVE_CHOICES_S[1]);
  const mutation = useAlarmAction(reservoirId);
  const needsReason = action === 'shelve' || action === 'out-of-service';
  const short = needsReason && text.trim().length < MIN_REASON_LENGTH;
  const submit = () => {
    const request: AlarmActionRequest =
      action === 'shelve'
        ? { action, reason: text, durationS }
        : action === 'out-of-service'
          ? { action, reason: text }
          : { action, ...(text.trim() ? { comment: text.trim() } : {}) };
    mutation.mutate({ conditionId: alarm.conditionId, request }, { onSuccess: onClose });
  };
  return (
    <Dialog open onClose={onClose} fullWidth maxWidth="sm" aria-labelledby="alarm-action-title">
      <DialogTitle id="alarm-action-title">
        {TITLE[action]}: {alarm.label}
      </DialogTitle>
      <DialogContent sx={{ display: 'flex', flexDirection: 'column', gap: 2 }}>
        <Typography variant="body2" sx={{ color: 'text.secondary' }}>
          {alarm.message}
        </Typography>
        {action === 'shelve' && (
          <TextField
            select
            label="Shelve for (site time)"
            value={durationS}
            onChange={(e) => setDurationS(Number(e.target.value))}
          >
            {SHELVE_CHOICES_S.map((s) => (
              <MenuItem key={s} value={s}>
                {hoursText(s)}
              </MenuItem>
            ))}
          </TextField>
        )}
        <TextField
          label={needsReason ? 'Reason (required)' : 'Comment (optional)'}
          value={text}
          onChange={(e) => setText(e.target.value)}
          multiline
          minRows={2}
          autoFocus
          slotProps={{ htmlInput: { maxLength: COMMENT_MAX, 'data-testid': 'alarm-action-text' } }}
          helperText={
            needsReason
              ? 'Recorded in the logbook with your name; the alarm stays away until you return it' +
                (action === 'shelve' ? ' or the shelf runs out' : '')
              : 'Recorded in the logbook with your name'
          }
        />
        {mutation.isError && <Alert severity="error">{describeError(mutation.error)}</Alert>}
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose}>Cancel</Button>
        <Button
          variant="contained"
          onClick={submit}
          disabled={short || mutation.isPending}
          data-testid="alarm-action-confirm"
        >
          {TITLE[action]}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
