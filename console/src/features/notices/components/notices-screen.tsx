import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { formatRelease } from '@stillwell/shared/notices';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useNotices } from '../api/get-notices';
import { useSendNotice } from '../api/send-notice';
import { useCan } from '../hooks/use-can';
import { countsSentence, groupByOrder } from '../utils/board';
import { NoticeCard } from './notice-card';

export interface NoticesScreenProps {
  definition: ReservoirDefinition;
}

/**
 * "Who has been told": every order's notices, zone by zone, with each contact's standing. Notices
 * are prepared by themselves when an order is drafted; the liaison reviews and sends them.
 */
export function NoticesScreen({ definition }: NoticesScreenProps) {
  const notices = useNotices(definition.id);
  const send = useSendNotice(definition.id);
  const canSend = useCan('notices.send');
  if (notices.isPending) return <LoadingMessage label="Loading the notices…" />;
  if (notices.isError)
    return (
      <ErrorMessage
        title="The notices could not be loaded."
        detail={describeError(notices.error)}
      />
    );
  const groups = groupByOrder(notices.data);
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Alert severity="info" variant="outlined">
        An order cannot be executed until every first-call contact of each zone it affects has been
        sent the notice and their lead time has run; arrival times are estimates from the
        engineer&apos;s travel-time tables.
      </Alert>
      {groups.length === 0 && (
        <Typography sx={{ color: 'text.secondary' }}>
          No notices yet: none of the drafted orders raises the release above a zone&apos;s
          threshold.
        </Typography>
      )}
      {groups.map((g) => {
        const unsent = g.notices.filter((n) => n.state === 'prepared');
        return (
          <Panel
            key={g.orderId}
            title={`Order ${g.orderId}: release to about ${formatRelease(g.releaseM3s)}`}
            aside={
              <Box sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
                {g.emergency && <Chip size="small" color="warning" label="Declared emergency" />}
                <Typography variant="body2" data-testid={`counts-${g.orderId}`}>
                  {countsSentence(g.counts)}
                </Typography>
                {unsent.length > 1 && canSend && (
                  <Button
                    size="small"
                    variant="contained"
                    disabled={send.isPending}
                    onClick={() => void Promise.all(unsent.map((n) => send.mutateAsync(n.id)))}
                  >
                    Send all {unsent.length}
                  </Button>
                )}
              </Box>
            }
          >
            <Box sx={{ display: 'grid', gap: 1.5 }}>
              {g.notices.map((n) => (
                <NoticeCard
                  key={n.id}
                  reservoirId={definition.id}
                  notice={n}
                  timeZone={definition.timeZone}
                />
              ))}
            </Box>
          </Panel>
        );
      })}
    </Box>
  );
}
