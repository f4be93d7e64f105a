import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import ListItemText from '@mui/material/ListItemText';
import Typography from '@mui/material/Typography';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useAlarmHistory } from '../api/get-alarm-history';
import { EVENT_TEXT, STATE_TEXT, priorityLabel, siteStamp } from '../utils/alarm-text';

export interface AlarmHistoryProps {
  reservoirId: string;
  conditionId: string;
  timeZone: string;
}

/** One alarm's record: every raise, clear and action, newest first, with who and why. */
export function AlarmHistory({ reservoirId, conditionId, timeZone }: AlarmHistoryProps) {
  const history = useAlarmHistory(reservoirId, conditionId);
  if (history.isPending) return <LoadingMessage label="Loading the alarm’s history…" />;
  if (history.isError)
    return (
      <ErrorMessage
        title="The history could not be loaded."
        detail={describeError(history.error)}
      />
    );
  const { condition, alarm, events } = history.data;
  return (
    <div data-testid="alarm-history">
      <Typography variant="subtitle1" sx={{ fontWeight: 600 }}>
        {condition.label}
      </Typography>
      <Typography variant="body2" sx={{ color: 'text.secondary' }}>
        {priorityLabel(condition.priority)} priority ·{' '}
        {alarm ? STATE_TEXT[alarm.state] : 'never raised'}
        {alarm && ` · raised ${alarm.activations} time${alarm.activations === 1 ? '' : 's'}`}
        {condition.onDelayS > 0 && ` · on-delay ${condition.onDelayS} s`}
        {condition.offDelayS > 0 && ` · clears after ${condition.offDelayS} s`}
        {condition.deadband !== null &&
          condition.unit &&
          ` · deadband ${condition.deadband} ${condition.unit}`}
      </Typography>
      <List dense>
        {events.map((e) => (
          <ListItem key={e.id} disableGutters data-testid="alarm-history-event">
            <ListItemText
              primary={`${EVENT_TEXT[e.kind]}${e.actor ? ` by ${e.actor}` : ''} — ${siteStamp(e.siteTimeMs, timeZone)}`}
              secondary={
                [e.text, e.logbookSeq !== null ? `logbook #${e.logbookSeq}` : null]
                  .filter(Boolean)
                  .join(' · ') || undefined
              }
            />
          </ListItem>
        ))}
      </List>
    </div>
  );
}
