import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { OrderImpact } from '@stillwell/shared/orders';

export interface ImpactSummaryProps {
  impact: OrderImpact | null;
  /** what the figures are: "before submitting" or "when drafted" */
  when: string;
}

const m3s = (v: number) => `${v.toFixed(0)} m3/s`;
const hours = (s: number) => `${(s / 3600).toFixed(1)} h`;

/** The routed effect of an order: release now and after, its steepest change, the peak pool. */
export function ImpactSummary({ impact, when }: ImpactSummaryProps) {
  if (!impact)
    return (
      <Typography variant="body2" color="text.secondary">
        No routed effect: there was no fresh pool reading {when}.
      </Typography>
    );
  const change = impact.releaseChange;
  return (
    <Box data-testid="order-impact" sx={{ display: 'grid', gap: 0.5 }}>
      <Typography variant="body2">
        Release {m3s(impact.currentRelease)} now, {m3s(impact.expectedRelease)} after the order (
        {change >= 0 ? '+' : ''}
        {m3s(change)}); steepest change while the gates travel{' '}
        {Math.abs(impact.steepestRatePerMin).toFixed(0)} m3/s per minute.
      </Typography>
      {impact.peakWith && impact.peakWithout ? (
        <Typography variant="body2" data-testid="order-impact-peak">
          Forecast peak pool {impact.peakWith.elevation.toFixed(2)} m in{' '}
          {hours(impact.peakWith.afterS)} with the order, {impact.peakWithout.elevation.toFixed(2)}{' '}
          m in {hours(impact.peakWithout.afterS)} without it (over {impact.horizonH} h).
        </Typography>
      ) : null}
      <Typography variant="caption" color="text.secondary">
        From the pool at {impact.pool.toFixed(2)} m {when}; {impact.basis}.
        {impact.notes.map((n) => ` ${n}.`).join('')} Decision support only: the approved operating
        rules and the duty engineer prevail.
      </Typography>
    </Box>
  );
}
