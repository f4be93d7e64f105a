import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import type { ReplayAlarmState, ReplayForecast, ReplaySeries } from '@stillwell/shared/replay';
import type { Quantity, UnitSystem } from '@stillwell/shared/units';
import { formatQuantity, formatSiteTime } from '../../../lib/format';
import { quantityOf } from '@stillwell/shared/units';
import { signal } from '../../../theme';
import { valueAt } from '../utils/playback';

export interface MomentPanelProps {
  cursorMs: number;
  series: readonly ReplaySeries[];
  alarms: readonly ReplayAlarmState[];
  forecast: ReplayForecast | null;
  system: UnitSystem;
  timeZone: string;
}

/** "206.99 m": a value in the chosen unit system, with its unit. */
function withUnit(siValue: number, quantity: Quantity, system: UnitSystem): string {
  const shown = formatQuantity(siValue, quantity, system);
  return `${shown.text} ${shown.unitText}`;
}

const PRIORITY_INK = { immediate: signal.alarm, prompt: signal.caution, advisory: signal.doubt };

/** What the control room had in front of it at the replay's moment. */
export function MomentPanel({
  cursorMs,
  series,
  alarms,
  forecast,
  system,
  timeZone,
}: MomentPanelProps) {
  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Box component="dl" sx={{ m: 0, display: 'grid', gridTemplateColumns: 'auto 1fr', gap: 0.5 }}>
        {series.map((s) => {
          const v = valueAt(s.t, s.v, cursorMs);
          const shown = v === null ? null : withUnit(v, quantityOf(s.unit), system);
          return (
            <Box key={s.channel} sx={{ display: 'contents' }}>
              <Typography component="dt" color="text.secondary">
                {s.label}
              </Typography>
              <Typography
                component="dd"
                data-testid={`replay-value-${s.channel}`}
                sx={{ m: 0, fontFamily: 'monospace', textAlign: 'right' }}
              >
                {shown ?? '—'}
              </Typography>
            </Box>
          );
        })}
      </Box>
      <Box>
        <Typography variant="subtitle2" color="text.secondary" gutterBottom>
          Alarms standing then ({alarms.length})
        </Typography>
        <Box data-testid="replay-alarms" sx={{ display: 'grid', gap: 0.5 }}>
          {alarms.length === 0 && <Typography color="text.secondary">None</Typography>}
          {alarms.map((a) => (
            <Box key={a.conditionId} sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
              <Chip
                size="small"
                label={a.priority}
                variant="outlined"
                sx={{ borderColor: PRIORITY_INK[a.priority], color: PRIORITY_INK[a.priority] }}
              />
              <Typography sx={{ fontSize: 14 }}>
                {a.conditionId} · {a.state}
                {a.actor ? ` by ${a.actor}` : ''} since {formatSiteTime(a.sinceMs, timeZone).time}
              </Typography>
            </Box>
          ))}
        </Box>
      </Box>
      <Box data-testid="replay-forecast">
        <Typography variant="subtitle2" color="text.secondary" gutterBottom>
          Forecast as it stood then
        </Typography>
        {forecast ? (
          <>
            <Typography sx={{ fontSize: 14 }}>
              Run of {formatSiteTime(forecast.computedAtMs, timeZone).time}: peak{' '}
              {withUnit(forecast.peak.elevation, 'length', system)} (p90{' '}
              {withUnit(forecast.peak.p90, 'length', system)}) at{' '}
              {formatSiteTime(forecast.peak.timeMs, timeZone).time}; time left:{' '}
              {forecast.timeLeftStatus}
            </Typography>
            <Typography sx={{ fontSize: 12, mt: 0.5 }} color="text.secondary">
              {forecast.caution}
            </Typography>
          </>
        ) : (
          <Typography color="text.secondary">No forecast run had been made by then.</Typography>
        )}
      </Box>
    </Box>
  );
}
