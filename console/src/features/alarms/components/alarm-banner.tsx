import { Link as RouterLink } from 'react-router-dom';
import Box from '@mui/material/Box';
import IconButton from '@mui/material/IconButton';
import Link from '@mui/material/Link';
import Tooltip from '@mui/material/Tooltip';
import SyncProblemIcon from '@mui/icons-material/SyncProblem';
import VolumeOffIcon from '@mui/icons-material/VolumeOff';
import VolumeUpIcon from '@mui/icons-material/VolumeUp';
import { PRIORITIES, type AlarmCounts } from '@stillwell/shared/alarms';
import { ApiError } from '../../../lib/api-client';
import { ink, signal } from '../../../theme';
import { useAlarms } from '../api/get-alarms';
import { ALARM_REFETCH_MS } from '../api/keys';
import { useAlarmSound, useAudibleCue } from '../hooks/use-audible-cue';
import { useLiveAlarms } from '../hooks/use-live-alarms';
import { priorityLabel } from '../utils/alarm-text';

export interface AlarmBannerProps {
  reservoirId: string;
  /** where the alarm list is */
  listHref: string;
}

const TONE = { immediate: signal.alarm, prompt: signal.caution, advisory: ink.primary } as const;

/**
 * The alarm counts by priority, on every screen of a reservoir, with the unacknowledged ones
 * called out and the audible cue's switch. Someone whose role does not see alarms sees nothing.
 * Being on every screen, it is also what keeps the reservoir's alarm list live.
 */
export function AlarmBanner({ reservoirId, listHref }: AlarmBannerProps) {
  const alarms = useAlarms(reservoirId);
  const liveIssue = useLiveAlarms(reservoirId);
  const [sound, setSound] = useAlarmSound();
  useAudibleCue(alarms.data?.alarms);
  if (alarms.error instanceof ApiError && alarms.error.status === 403) return null;
  const counts: AlarmCounts | undefined = alarms.data?.counts;
  return (
    <Box
      data-testid="alarm-banner"
      role="status"
      aria-label="Alarm counts"
      sx={{ display: 'flex', alignItems: 'center', gap: 1.5 }}
    >
      <Link
        component={RouterLink}
        to={listHref}
        underline="hover"
        sx={{ display: 'flex', gap: 1.5 }}
      >
        {PRIORITIES.map((p) => {
          const c = counts?.byPriority[p];
          const total = c?.total ?? 0;
          return (
            <Box
              key={p}
              component="span"
              data-testid={`alarm-count-${p}`}
              data-unacknowledged={c?.unacknowledged ?? 0}
              sx={{
                color: total > 0 ? TONE[p] : ink.muted,
                fontWeight: (c?.unacknowledged ?? 0) > 0 ? 700 : 400,
                whiteSpace: 'nowrap',
              }}
            >
              {priorityLabel(p)} {counts ? total : '–'}
              {(c?.unacknowledged ?? 0) > 0 && ` (${c!.unacknowledged} new)`}
            </Box>
          );
        })}
        {counts && counts.shelved + counts.outOfService > 0 && (
          <Box component="span" data-testid="alarm-count-away" sx={{ color: ink.secondary }}>
            · {counts.shelved} shelved, {counts.outOfService} out of service
          </Box>
        )}
      </Link>
      {liveIssue && (
        <Tooltip
          title={`${liveIssue}. The list is fetched again every ${ALARM_REFETCH_MS / 1000} s meanwhile.`}
        >
          <SyncProblemIcon
            data-testid="alarm-live-issue"
            aria-label={liveIssue}
            fontSize="small"
            sx={{ color: signal.caution }}
          />
        </Tooltip>
      )}
      <Tooltip
        title={sound ? 'Sound for new immediate alarms: on' : 'Sound for new immediate alarms: off'}
      >
        <IconButton
          size="small"
          aria-label={sound ? 'Turn the alarm sound off' : 'Turn the alarm sound on'}
          aria-pressed={sound}
          onClick={() => setSound(!sound)}
          sx={{ color: sound ? ink.primary : ink.muted }}
        >
          {sound ? <VolumeUpIcon fontSize="small" /> : <VolumeOffIcon fontSize="small" />}
        </IconButton>
      </Tooltip>
    </Box>
  );
}
