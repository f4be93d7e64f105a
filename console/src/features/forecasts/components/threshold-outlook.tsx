import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { ForecastRun, ThresholdOutlook } from '@stillwell/shared/forecasts';
import type { UnitSystem } from '@stillwell/shared/units';
import { formatQuantity } from '../../../lib/format';
import { leadText, siteClockText } from '../utils/format-time';

export interface ThresholdOutlookListProps {
  run: ForecastRun;
  /** the site's now, so a lead counts down between runs */
  siteNowMs: number;
  system: UnitSystem;
  timeZone: string;
}

type Tone = 'above' | 'ahead' | 'clear';

function whenText(t: ThresholdOutlook, nowMs: number, timeZone: string): [string, Tone] {
  if (t.alreadyAbove) return ['above now', 'above'];
  if (t.timeMs === null) return ['not reached', 'clear'];
  if (t.timeMs <= nowMs) return [`reached ${siteClockText(t.timeMs, timeZone)}`, 'above'];
  return [
    `in ${leadText((t.timeMs - nowMs) / 1000)} · ${siteClockText(t.timeMs, timeZone)}`,
    'ahead',
  ];
}

const TONE_COLOR: Record<Tone, string> = {
  above: 'signal.alarm',
  ahead: 'signal.caution',
  clear: 'text.secondary',
};

/**
 * Every threshold with the forecast's time to it, lowest first: the "next threshold" readout names
 * only one, and the room plans around all of them.
 */
export function ThresholdOutlookList({
  run,
  siteNowMs,
  system,
  timeZone,
}: ThresholdOutlookListProps) {
  const levels = [...run.thresholds].sort((a, b) => a.elevation - b.elevation);
  const horizonH = Math.round(run.inputs.horizonS / 3600);
  return (
    <Box
      component="section"
      aria-label="Time to each threshold"
      data-testid="threshold-outlook"
      sx={{
        display: 'grid',
        gap: 1,
        gridTemplateColumns: 'repeat(auto-fill, minmax(190px, 1fr))',
        border: 1,
        borderColor: 'divider',
        borderRadius: 1,
        p: 1.5,
      }}
    >
      <Typography
        variant="overline"
        component="h3"
        sx={{ gridColumn: '1 / -1', color: 'text.secondary', lineHeight: 1.5 }}
      >
        Time to each threshold (forecast median, {horizonH} h ahead)
      </Typography>
      {levels.map((t) => {
        const [text, tone] = whenText(t, siteNowMs, timeZone);
        const level = formatQuantity(t.elevation, 'length', system);
        return (
          <Box key={t.id} data-testid={`threshold-outlook-${t.id}`} data-tone={tone}>
            <Typography variant="body2" sx={{ color: 'text.secondary' }}>
              {t.label} · {level.text} {level.unitText}
            </Typography>
            <Typography
              variant="body2"
              sx={{ color: TONE_COLOR[tone], fontWeight: tone === 'clear' ? 400 : 500 }}
            >
              {text}
            </Typography>
            {tone === 'ahead' && (
              <Typography variant="caption" component="div" sx={{ color: 'text.secondary' }}>
                {Math.round(t.probability * 100)} % of the ensemble reach it
              </Typography>
            )}
          </Box>
        );
      })}
    </Box>
  );
}
