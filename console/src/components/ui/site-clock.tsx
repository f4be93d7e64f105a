import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import type { SiteClock as SiteClockValue } from '@stillwell/shared/telemetry';
import { formatNumber, formatSiteTime } from '../../lib/format';
import { signal } from '../../theme';

export interface SiteClockProps {
  /** the site clock from the latest status; null until one has arrived */
  clock: SiteClockValue | null;
  timeZone: string;
  /** the status is overdue: the time shown is the last one known, not now */
  stale?: boolean;
}

/** The plant's time in its own zone, named; says plainly when the clock is a simulation's. */
export function SiteClock({ clock, timeZone, stale = false }: SiteClockProps) {
  const shown = clock ? formatSiteTime(clock.now, timeZone) : null;
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5 }}>
      {clock?.simulated && (
        <Tooltip title="The plant's clock is driven by the simulator, faster than real time.">
          <Chip
            size="small"
            variant="outlined"
            data-testid="simulated-clock"
            label={`SIMULATED ×${formatNumber(clock.speed, clock.speed < 10 ? 1 : 0)}`}
            sx={{ borderColor: signal.caution, color: signal.caution }}
          />
        </Tooltip>
      )}
      <Box sx={{ textAlign: 'right' }}>
        <Typography
          variant="numeric"
          component="div"
          data-testid="site-clock"
          aria-label={stale ? 'Site time, last known' : 'Site time'}
          data-stale={stale ? 'true' : 'false'}
          sx={{
            fontSize: '1.3rem',
            fontWeight: 500,
            lineHeight: 1.2,
            color: stale ? signal.doubt : 'text.primary',
          }}
        >
          {shown ? `${shown.time} ${shown.zone}` : '--:--:--'}
        </Typography>
        <Typography variant="caption" component="div" sx={{ color: 'text.secondary' }}>
          {stale && 'last known · '}
          {shown ? `${shown.date} · ${timeZone}` : timeZone}
        </Typography>
      </Box>
    </Box>
  );
}
