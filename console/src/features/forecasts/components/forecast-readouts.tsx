import Box from '@mui/material/Box';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ForecastUpdate } from '@stillwell/shared/forecasts';
import type { UnitSystem } from '@stillwell/shared/units';
import { Readout } from '../../../components/ui/readout';
import { formatQuantity } from '../../../lib/format';
import type { Severity } from '../../../lib/severity';
import { countdownOf } from '../utils/countdown';
import { leadText, siteClockText } from '../utils/format-time';
import { nextThreshold } from '../utils/next-threshold';
import { ForecastCaution } from './forecast-caution';
import { ThresholdOutlookList } from './threshold-outlook';
import { TimeLeftCountdown } from './time-left-countdown';

export interface ForecastReadoutsProps {
  update: ForecastUpdate | undefined;
  /** the site's now, ticking between pushes; null until a status has come */
  siteNowMs: number | null;
  system: UnitSystem;
  timeZone: string;
  /** why the forecast could not be loaded, if it could not */
  error?: string | null;
}

/**
 * The forecast's numbers on the overview: time left to act (the countdown), the forecast peak and
 * when, the next threshold and how long until it (and the time to every threshold below), and the
 * smallest opening that holds the target if ordered now. Each carries its age, and the caution.
 */
export function ForecastReadouts({
  update,
  siteNowMs,
  system,
  timeZone,
  error,
}: ForecastReadoutsProps) {
  const run = update?.run ?? null;
  const countdown = countdownOf(update, siteNowMs);
  const now = siteNowMs ?? run?.computedAtMs ?? 0;
  const length = (si: number) => formatQuantity(si, 'length', system);
  const unit = length(0).unitText;
  const doubt = { stale: countdown.stale, quality: run ? ('good' as const) : null };
  const peak = run?.peak;
  const next = run ? nextThreshold(run, now) : null;
  const peakSeverity: Severity = !run
    ? 'normal'
    : peak!.elevation > run.timeLeft.target
      ? 'alarm'
      : next
        ? 'caution'
        : 'normal';
  const hold = run?.holdNow;

  return (
    <Stack spacing={1} component="section" aria-label="Forecast">
      {error && (
        <Typography role="alert" sx={{ color: 'signal.doubt' }}>
          The forecast could not be loaded: {error}
        </Typography>
      )}
      <Box
        sx={{
          display: 'grid',
          gap: 1.5,
          gridTemplateColumns: {
            xs: '1fr',
            md: 'minmax(300px, 1.6fr) repeat(3, minmax(160px, 1fr))',
          },
        }}
      >
        <TimeLeftCountdown countdown={countdown} planLabel={run?.timeLeft.plan.label ?? null} />
        <Readout
          label="Forecast peak"
          valueTestId="forecast-peak"
          value={peak ? length(peak.elevation).text : null}
          unit={unit}
          severity={peakSeverity}
          {...doubt}
          caption={
            peak && run
              ? [
                  `at ${siteClockText(peak.timeMs, timeZone)}`,
                  `band ${length(peak.p10).text}–${length(peak.p90).text} ${unit}`,
                  peak.leftTableAtMs !== null && 'beyond the storage table: a lower bound',
                ]
                  .filter(Boolean)
                  .join(' · ')
              : 'no forecast'
          }
        />
        <Readout
          label="Next threshold"
          valueTestId="next-threshold"
          value={run ? (next ? leadText((next.timeMs! - now) / 1000) : 'none') : null}
          unit=""
          severity={next ? 'caution' : 'normal'}
          {...doubt}
          caption={
            !run
              ? 'no forecast'
              : next
                ? `${next.label} (${length(next.elevation).text} ${unit}) at ${siteClockText(next.timeMs!, timeZone)} · ${Math.round(next.probability * 100)} % of the ensemble`
                : `none reached within ${Math.round(run.inputs.horizonS / 3600)} h`
          }
        />
        <Readout
          label="Opening that holds now"
          valueTestId="hold-now"
          value={
            !hold
              ? null
              : hold.status === 'ok'
                ? length(hold.opening!).text
                : hold.status === 'not-needed'
                  ? 'none'
                  : 'not enough'
          }
          unit={hold?.status === 'ok' ? unit : ''}
          severity={hold?.status === 'impossible' ? 'alarm' : 'normal'}
          {...doubt}
          caption={hold ? `${capitalise(hold.message)}.` : 'no forecast'}
        />
      </Box>
      {run && (
        <ThresholdOutlookList run={run} siteNowMs={now} system={system} timeZone={timeZone} />
      )}
      <Typography variant="body2" sx={{ color: 'text.secondary' }} data-testid="forecast-age">
        {run
          ? `Forecast of ${siteClockText(run.computedAtMs, timeZone)} (${leadText(countdown.ageS ?? 0)} ago, site time), ${run.inputs.ensemble.members} inflow scenarios; inflow ${run.inputs.inflow.method.replace('-', ' ')}: ${run.inputs.inflow.reason}.`
          : (update?.problem ?? 'Waiting for the first forecast run.')}
      </Typography>
      <ForecastCaution text={update?.caution} />
    </Stack>
  );
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
