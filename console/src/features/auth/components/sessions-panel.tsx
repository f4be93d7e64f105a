import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useEndSessions, useSessions } from '../api/sessions';
import { browserOf, formatWhen } from '../utils/session-text';

/** One's own live sessions; any but this one can be ended here (this one by signing out). */
export function SessionsPanel() {
  const sessions = useSessions();
  const end = useEndSessions();
  const others = sessions.data?.filter((s) => !s.current).length ?? 0;
  return (
    <Panel
      title="Your sessions"
      aside={
        <Button
          size="small"
          disabled={others === 0 || end.isPending}
          onClick={() => end.mutate(null)}
          data-testid="end-other-sessions"
        >
          End all others
        </Button>
      }
    >
      {sessions.isPending && <LoadingMessage label="Loading your sessions…" />}
      {sessions.isError && (
        <ErrorMessage
          title="Your sessions could not be loaded."
          detail={describeError(sessions.error)}
        />
      )}
      {end.isError && <Alert severity="error">{describeError(end.error)}</Alert>}
      {sessions.data && (
        <Table size="small" aria-label="Your sessions" data-testid="sessions">
          <TableHead>
            <TableRow>
              <TableCell>Browser</TableCell>
              <TableCell>Address</TableCell>
              <TableCell>Signed in</TableCell>
              <TableCell>Last renewed</TableCell>
              <TableCell>Ends by</TableCell>
              <TableCell />
            </TableRow>
          </TableHead>
          <TableBody>
            {sessions.data.map((s) => (
              <TableRow key={s.id} data-testid={`session-${s.id}`}>
                <TableCell title={s.userAgent ?? undefined}>{browserOf(s.userAgent)}</TableCell>
                <TableCell>{s.ip ?? 'unknown'}</TableCell>
                <TableCell>{formatWhen(s.createdAt)}</TableCell>
                <TableCell>{formatWhen(s.lastRefreshedAt)}</TableCell>
                <TableCell>{formatWhen(s.expiresAt)}</TableCell>
                <TableCell align="right">
                  {s.current ? (
                    <Chip size="small" label="This session" />
                  ) : (
                    <Button
                      size="small"
                      color="warning"
                      disabled={end.isPending}
                      onClick={() => end.mutate(s.id)}
                    >
                      End
                    </Button>
                  )}
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
    </Panel>
  );
}
