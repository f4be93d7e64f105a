import Accordion from '@mui/material/Accordion';
import AccordionDetails from '@mui/material/AccordionDetails';
import AccordionSummary from '@mui/material/AccordionSummary';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { fonts } from '../../../theme';
import { useOutbox } from '../api/get-outbox';

/** Demo mode: what the demo mail server received, as the people downstream would read it. */
export function OutboxScreen() {
  const outbox = useOutbox();
  if (outbox.isPending) return <LoadingMessage label="Loading the demo outbox…" />;
  if (outbox.isError)
    return (
      <ErrorMessage
        title="The demo outbox could not be loaded."
        detail={describeError(outbox.error)}
      />
    );
  return (
    <Panel
      title={`Demo outbox: ${outbox.data.length} ${outbox.data.length === 1 ? 'message' : 'messages'}`}
    >
      <Alert severity="info" variant="outlined" sx={{ mb: 1.5 }}>
        Demo mode: notices go to a mail server inside Stillwell, not to anyone&apos;s inbox.
        Addresses ending in .invalid are refused, to show a bounce.
      </Alert>
      {outbox.data.length === 0 && (
        <Typography sx={{ color: 'text.secondary' }}>No mail has been sent yet.</Typography>
      )}
      {outbox.data.map((m) => (
        <Accordion key={m.id} disableGutters data-testid="outbox-message">
          <AccordionSummary>
            <Box sx={{ display: 'grid', gridTemplateColumns: '220px 1fr', gap: 2, width: '100%' }}>
              <Typography variant="body2">{m.to.join(', ')}</Typography>
              <Typography variant="body2" sx={{ fontWeight: 500 }}>
                {m.subject}
              </Typography>
            </Box>
          </AccordionSummary>
          <AccordionDetails>
            <Typography variant="body2" sx={{ color: 'text.secondary', mb: 1 }}>
              From {m.from}, received {new Date(m.receivedAt).toLocaleString()} (wall clock)
            </Typography>
            <Box
              component="pre"
              data-testid="outbox-text"
              sx={{ whiteSpace: 'pre-wrap', fontFamily: fonts.mono, fontSize: 13, m: 0 }}
            >
              {m.text}
            </Box>
          </AccordionDetails>
        </Accordion>
      ))}
    </Panel>
  );
}
