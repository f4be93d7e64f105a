import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { formatRelease } from '@stillwell/shared/notices';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { fonts } from '../../../theme';
import { useAcknowledgeRelease } from '../api/acknowledge-release';
import { useMyReleases } from '../api/get-my-releases';
import { siteTime } from '../utils/times';

/**
 * A downstream stakeholder's view: the releases coming to their zones, and their acknowledgement.
 * Outside any one reservoir's screens: a stakeholder may not read the reservoir or its telemetry.
 */
export function MyReleasesScreen() {
  const releases = useMyReleases();
  const ack = useAcknowledgeRelease();
  if (releases.isPending) return <LoadingMessage label="Loading your releases…" />;
  if (releases.isError)
    return (
      <ErrorMessage
        title="Your releases could not be loaded."
        detail={describeError(releases.error)}
      />
    );
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      {releases.data.length === 0 && (
        <Typography sx={{ color: 'text.secondary' }}>
          No release is coming to your zones.
        </Typography>
      )}
      {ack.isError && <Alert severity="error">{describeError(ack.error)}</Alert>}
      {releases.data.map((r) => {
        const t = (ms: number) => siteTime(ms, r.timeZone);
        return (
          <Panel
            key={`${r.noticeId}-${r.organisation}`}
            title={`${r.zoneName}: ${r.damName} releasing about ${formatRelease(r.releaseM3s)}`}
            aside={
              <Box sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
                {r.emergency && <Chip size="small" color="warning" label="Declared emergency" />}
                <Chip
                  size="small"
                  variant="outlined"
                  label={r.phase === 'upcoming' ? 'Coming' : 'Under way'}
                />
                {r.acknowledgedAt !== null ? (
                  <Typography variant="body2" data-testid="acknowledged-at">
                    Acknowledged {t(r.acknowledgedAt)}
                  </Typography>
                ) : r.recipientId ? (
                  <Button
                    variant="contained"
                    size="small"
                    disabled={ack.isPending}
                    onClick={() => ack.mutate(r.recipientId!)}
                  >
                    Acknowledge
                  </Button>
                ) : (
                  <Typography variant="body2" sx={{ color: 'text.secondary' }}>
                    Sent to others in your zone
                  </Typography>
                )}
              </Box>
            }
          >
            <Typography>
              Starts at the dam {t(r.startAt)}; expected at {r.zoneName} {t(r.arrivalAt)} (the
              dam&apos;s local time).
            </Typography>
            <Box
              component="pre"
              sx={{ whiteSpace: 'pre-wrap', fontFamily: fonts.mono, fontSize: 13, mb: 0 }}
            >
              {r.message}
            </Box>
          </Panel>
        );
      })}
    </Box>
  );
}
