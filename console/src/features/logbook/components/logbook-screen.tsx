import { useEffect, useRef, useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import type { LogbookEntry } from '@stillwell/shared/logbook';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { useLiveSocket } from '../../../lib/live-connection';
import { useLogbookPage } from '../api/get-logbook';
import { logbookKeys } from '../api/keys';
import { exportCsv } from '../api/shift-log';
import { startLogbookSync } from '../live/logbook-sync';
import { DEFAULT_VIEW, type LogbookView } from '../utils/filters';
import { ChainPanel } from './chain-panel';
import { EntryDetail } from './entry-detail';
import { LogbookFilters } from './logbook-filters';
import { LogbookGrid } from './logbook-grid';
import { ShiftLogForm } from './shift-log-form';

export interface LogbookScreenProps {
  definition: ReservoirDefinition;
}

/** The one record of everything: the grid, the chosen entry, the chain, the shift log. */
export function LogbookScreen({ definition }: LogbookScreenProps) {
  const [view, setView] = useState<LogbookView>(DEFAULT_VIEW);
  const [selected, setSelected] = useState<LogbookEntry | null>(null);
  const [newElsewhere, setNewElsewhere] = useState(0);
  const [issue, setIssue] = useState<string | null>(null);
  const [exportError, setExportError] = useState<string | null>(null);
  const page = useLogbookPage(view);
  const socket = useLiveSocket();
  const queryClient = useQueryClient();
  const viewRef = useRef(view);
  useEffect(() => {
    viewRef.current = view;
  }, [view]);
  useEffect(
    () =>
      startLogbookSync({
        socket,
        queryClient,
        view: () => viewRef.current,
        onNewElsewhere: () => setNewElsewhere((n) => n + 1),
        onIssue: setIssue,
      }),
    [socket, queryClient],
  );
  const refresh = () => {
    setNewElsewhere(0);
    void queryClient.invalidateQueries({ queryKey: logbookKeys.pages() });
  };
  return (
    <Box
      sx={{
        display: 'grid',
        gridTemplateColumns: { xs: '1fr', xl: '8fr 4fr' },
        gap: 2,
        alignItems: 'start',
      }}
    >
      <Box sx={{ display: 'grid', gap: 2, minWidth: 0 }}>
        <Panel
          title="Logbook"
          aside={
            <Button
              size="small"
              onClick={() =>
                exportCsv(view.filter).catch((e: unknown) => setExportError(describeError(e)))
              }
            >
              Export these entries (CSV)
            </Button>
          }
        >
          <Box sx={{ display: 'grid', gap: 1 }}>
            <LogbookFilters
              filter={view.filter}
              definition={definition}
              onChange={(filter) => setView({ ...view, filter, page: 0 })}
            />
            {issue && <Alert severity="warning">{issue}</Alert>}
            {exportError && <Alert severity="error">{exportError}</Alert>}
            {page.isError && <Alert severity="error">{describeError(page.error)}</Alert>}
            {newElsewhere > 0 && (
              <Alert
                severity="info"
                action={
                  <Button size="small" onClick={refresh}>
                    Show
                  </Button>
                }
              >
                {newElsewhere} new entr{newElsewhere === 1 ? 'y' : 'ies'} since this page was
                loaded.
              </Alert>
            )}
            <LogbookGrid
              rows={page.data?.rows ?? []}
              total={page.data?.total ?? 0}
              loading={page.isFetching}
              view={view}
              timeZone={definition.timeZone}
              onView={(v) => {
                setNewElsewhere(0);
                setView(v);
              }}
              onSelect={setSelected}
            />
          </Box>
        </Panel>
        {selected && (
          <Panel
            title="Entry"
            aside={
              <Button size="small" onClick={() => setSelected(null)}>
                Close
              </Button>
            }
          >
            <EntryDetail entry={selected} timeZone={definition.timeZone} />
          </Panel>
        )}
      </Box>
      <Box sx={{ display: 'grid', gap: 2 }}>
        <Panel title="Chain">
          <ChainPanel
            timeZone={definition.timeZone}
            printHref={paths.logbookHeadPrint.getHref(definition.id)}
          />
        </Panel>
        <Panel title="Shift log">
          <ShiftLogForm definition={definition} />
        </Panel>
        <Typography variant="caption" color="text.secondary">
          Every entry is hashed with the one before it (RFC 8785 canonical JSON, SHA-256);
          attachments are kept under their own SHA-256, named in the entry, so the chain covers
          their bytes too.
        </Typography>
      </Box>
    </Box>
  );
}
