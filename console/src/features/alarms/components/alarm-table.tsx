import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { Action } from '@stillwell/shared/access';
import type { AlarmView } from '@stillwell/shared/alarms';
import { ink } from '../../../theme';
import { STATE_TEXT, siteStamp, valueText } from '../utils/alarm-text';
import type { DialogAction } from './alarm-action-dialog';
import { PriorityTag } from './priority-tag';

export interface AlarmTableProps {
  alarms: readonly AlarmView[];
  timeZone: string;
  mayDo: (action: Action) => boolean;
  onAction: (alarm: AlarmView, action: DialogAction) => void;
  onHistory: (alarm: AlarmView) => void;
  selected: string | null;
}

/** The operator's list, in the gateway's order: unacknowledged first, then priority, then time. */
export function AlarmTable({
  alarms,
  timeZone,
  mayDo,
  onAction,
  onHistory,
  selected,
}: AlarmTableProps) {
  if (alarms.length === 0) {
    return (
      <Typography sx={{ color: 'text.secondary', p: 1 }} data-testid="no-alarms">
        No alarms: every condition is clear and acknowledged.
      </Typography>
    );
  }
  return (
    <Table size="small" aria-label="Alarms">
      <TableHead>
        <TableRow>
          <TableCell>Priority</TableCell>
          <TableCell>Alarm</TableCell>
          <TableCell>State</TableCell>
          <TableCell>Raised</TableCell>
          <TableCell>Value</TableCell>
          <TableCell align="right">Actions</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {alarms.map((a) => {
          const inService = a.handling === 'in-service';
          return (
            <TableRow
              key={a.conditionId}
              data-testid={`alarm-row-${a.conditionId}`}
              data-state={a.state}
              selected={selected === a.conditionId}
            >
              <TableCell>
                <PriorityTag priority={a.priority} solid={inService && !a.acknowledged} />
              </TableCell>
              <TableCell>
                <Typography sx={{ fontWeight: a.acknowledged ? 400 : 700 }}>{a.label}</Typography>
                <Typography variant="body2" sx={{ color: ink.secondary }}>
                  {a.message}
                </Typography>
                {a.reason && (
                  <Typography variant="body2" sx={{ color: ink.secondary }}>
                    {a.handling === 'shelved' ? 'Shelved' : 'Out of service'} by {a.handledBy}:{' '}
                    {a.reason}
                    {a.shelvedUntilMs !== null &&
                      `, until ${siteStamp(a.shelvedUntilMs, timeZone)}`}
                  </Typography>
                )}
              </TableCell>
              <TableCell data-testid="alarm-state">{STATE_TEXT[a.state]}</TableCell>
              <TableCell sx={{ whiteSpace: 'nowrap' }}>
                {siteStamp(a.raisedAtMs, timeZone)}
              </TableCell>
              <TableCell>{valueText(a)}</TableCell>
              <TableCell align="right">
                <Box
                  sx={{ display: 'flex', gap: 0.5, justifyContent: 'flex-end', flexWrap: 'wrap' }}
                >
                  {inService && !a.acknowledged && (
                    <Button
                      size="small"
                      variant="contained"
                      disabled={!mayDo('alarms.acknowledge')}
                      onClick={() => onAction(a, 'acknowledge')}
                    >
                      Acknowledge
                    </Button>
                  )}
                  {inService && (
                    <Button
                      size="small"
                      disabled={!mayDo('alarms.shelve')}
                      onClick={() => onAction(a, 'shelve')}
                    >
                      Shelve
                    </Button>
                  )}
                  {a.handling !== 'out-of-service' && (
                    <Button
                      size="small"
                      disabled={!mayDo('alarms.shelve')}
                      onClick={() => onAction(a, 'out-of-service')}
                    >
                      Out of service
                    </Button>
                  )}
                  {!inService && (
                    <Button
                      size="small"
                      disabled={!mayDo('alarms.shelve')}
                      onClick={() => onAction(a, 'return-to-service')}
                    >
                      Return to service
                    </Button>
                  )}
                  <Button size="small" onClick={() => onHistory(a)}>
                    History
                  </Button>
                </Box>
              </TableCell>
            </TableRow>
          );
        })}
      </TableBody>
    </Table>
  );
}
