import { useState } from 'react';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { AlarmView } from '@stillwell/shared/alarms';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useAlarms } from '../api/get-alarms';
import { useMayDo } from '../api/get-me';
import { AlarmActionDialog, type DialogAction } from './alarm-action-dialog';
import { AlarmHistory } from './alarm-history';
import { AlarmTable } from './alarm-table';

export interface AlarmsScreenProps {
  definition: ReservoirDefinition;
}

/** The alarm list with each alarm's history beside it. */
export function AlarmsScreen({ definition }: AlarmsScreenProps) {
  const alarms = useAlarms(definition.id);
  const mayDo = useMayDo();
  const [acting, setActing] = useState<{ alarm: AlarmView; action: DialogAction } | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  return (
    <Box
      sx={{
        display: 'grid',
        gap: 2,
        gridTemplateColumns: { xs: '1fr', lg: selected ? '2fr 1fr' : '1fr' },
      }}
    >
      <Panel title="Alarms">
        {alarms.isPending && <LoadingMessage label="Loading the alarms…" />}
        {alarms.isError && (
          <ErrorMessage
            title="The alarms could not be loaded."
            detail={describeError(alarms.error)}
          />
        )}
        {alarms.data && (
          <AlarmTable
            alarms={alarms.data.alarms}
            timeZone={definition.timeZone}
            mayDo={mayDo}
            selected={selected}
            onAction={(alarm, action) => setActing({ alarm, action })}
            onHistory={(a) => setSelected(a.conditionId)}
          />
        )}
        <Typography variant="body2" sx={{ color: 'text.secondary', mt: 1.5 }}>
          Shelving, taking out of service and returning to service are for the duty engineer. Alarms
          are decision support; the dam’s operating rules and emergency action plan prevail.
        </Typography>
      </Panel>
      {selected && (
        <Panel title="Alarm history">
          <AlarmHistory
            reservoirId={definition.id}
            conditionId={selected}
            timeZone={definition.timeZone}
          />
        </Panel>
      )}
      {acting && (
        <AlarmActionDialog
          reservoirId={definition.id}
          alarm={acting.alarm}
          action={acting.action}
          onClose={() => setActing(null)}
        />
      )}
    </Box>
  );
}
