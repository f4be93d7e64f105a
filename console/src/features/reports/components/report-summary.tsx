import Box from '@mui/material/Box';
import type { Quantity, UnitSystem } from '@stillwell/shared/units';
import type { EventReport, Peak } from '@stillwell/shared/reports';
import { Readout } from '../../../components/ui/readout';
import { useUnitSystem } from '../../../hooks/use-unit-system';
import { formatQuantity } from '../../../lib/format';
import { siteMoment } from '../utils/report-text';

/** A peak this close to the window's end may not be the event's peak. */
const AT_END_MS = 15 * 60_000;

export interface ReportSummaryProps {
  report: EventReport;
  timeZone: string;
}

function shown(value: number | null, quantity: Quantity, system: UnitSystem, signed = false) {
  if (value === null) return { text: null, unit: formatQuantity(0, quantity, system).unitText };
  const d = formatQuantity(value, quantity, system, { signed });
  return { text: d.text, unit: d.unitText };
}

/** The window's peaks and largest rise, in the units the console shows. */
export function ReportSummary({ report, timeZone }: ReportSummaryProps) {
  const [system] = useUnitSystem();
  const s = report.summary;
  // a peak at the very end of the window is where the window stopped, not where the pool did
  const cutOff = (p: Peak | null) => p !== null && report.to - p.t <= AT_END_MS;
  const peak = (label: string, p: Peak | null, quantity: Quantity, testId: string) => {
    const v = shown(p?.value ?? null, quantity, system);
    return (
      <Readout
        label={label}
        value={v.text}
        unit={v.unit}
        valueTestId={testId}
        caption={
          p
            ? `${siteMoment(p.t, timeZone)} · ${p.channel}${cutOff(p) ? " · at the window's end: the peak may come later" : ''}`
            : 'No readings in the window'
        }
      />
    );
  };
  const rise = shown(s.maxRateOfRise?.value ?? null, 'riseRate', system, true);
  return (
    <Box
      sx={{
        display: 'grid',
        gap: 1.5,
        gridTemplateColumns: 'repeat(auto-fit, minmax(220px, 1fr))',
      }}
    >
      {peak('Peak pool', s.peakPool, 'length', 'report-peak-pool')}
      {peak('Peak inflow', s.peakInflow, 'flow', 'report-peak-inflow')}
      {peak('Peak outflow', s.peakOutflow, 'flow', 'report-peak-outflow')}
      <Readout
        label="Largest rate of rise"
        value={rise.text}
        unit={rise.unit}
        valueTestId="report-max-rise"
        caption={
          s.maxRateOfRise
            ? `30-minute slope ending ${siteMoment(s.maxRateOfRise.t, timeZone)}`
            : 'Too few pool readings'
        }
      />
    </Box>
  );
}
