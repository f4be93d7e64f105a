import type { ReactNode } from 'react';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { EventReport } from '@stillwell/shared/reports';
import { Panel } from '../../../components/ui/panel';
import { signedMetres, siteMoment, spanText } from '../utils/report-text';

export interface ReportDetailsProps {
  report: EventReport;
  timeZone: string;
}

function Grid({ head, rows, empty }: { head: string[]; rows: ReactNode[][]; empty: string }) {
  if (!rows.length)
    return (
      <Typography variant="body2" color="text.secondary">
        {empty}
      </Typography>
    );
  return (
    <Table size="small">
      <TableHead>
        <TableRow>
          {head.map((h) => (
            <TableCell key={h}>{h}</TableCell>
          ))}
        </TableRow>
      </TableHead>
      <TableBody>
        {rows.map((cells, i) => (
          <TableRow key={i}>
            {cells.map((c, j) => (
              <TableCell key={j}>{c}</TableCell>
            ))}
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}

/** Forecasts against the peak, decisions, notices, alarms and the logbook check. */
export function ReportDetails({ report: r, timeZone }: ReportDetailsProps) {
  const at = (ms: number | null) => (ms === null ? '–' : siteMoment(ms, timeZone));
  return (
    <Box
      sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'repeat(auto-fit, minmax(640px, 1fr))' }}
    >
      <Panel title="Forecasts against the actual peak">
        <Grid
          head={['Before peak', 'Run computed', 'Forecast peak', 'Error', 'Timing']}
          empty="No actual peak in the window."
          rows={r.forecasts.map((f) => [
            `${f.leadHours} h`,
            f.runId === null ? 'No run' : `${at(f.computedAt)} (run ${f.runId})`,
            f.forecastPeak === null ? '–' : `${f.forecastPeak.toFixed(3)} m`,
            signedMetres(f.error),
            spanText(f.timingError, true),
          ])}
        />
      </Panel>
      <Panel title="Decisions">
        <Grid
          head={['Order', 'State', 'Steps', 'Draft to confirmation']}
          empty="No gate orders in the window."
          rows={r.orders.map((o) => [
            `Order ${o.orderId}${o.emergency ? ' (emergency)' : ''}`,
            o.state,
            o.steps.map((s) => s.kind.replace(/^(order|command)\./, '')).join(' → '),
            spanText(o.draftToConfirmation),
          ])}
        />
      </Panel>
      <Panel title="Notices">
        <Grid
          head={['Contact', 'Zone', 'Sent', 'Lead got', 'Needed', '']}
          empty="No release notices in the window."
          rows={r.notices.map((n) => [
            n.contactName,
            n.zoneName,
            at(n.sentAt),
            n.gotS === null ? 'Never sent' : spanText(n.gotS * 1000),
            spanText(n.neededS * 1000),
            n.short ? <Chip size="small" color="warning" label="Short" /> : 'Enough',
          ])}
        />
      </Panel>
      <Panel title="Alarms">
        <Typography variant="body2" sx={{ mb: 1 }} data-testid="report-alarm-counts">
          {r.alarms.raised} raised, {r.alarms.acknowledged} acknowledged, median time to acknowledge{' '}
          {spanText(r.alarms.medianToAck)}
        </Typography>
        <Grid
          head={['Alarm', 'Priority', 'Raised', 'Acknowledged', 'Median', 'Longest']}
          empty="No alarms raised in the window."
          rows={r.alarms.byCondition.map((a) => [
            a.label,
            a.priority,
            a.raised,
            a.acknowledged,
            spanText(a.medianToAck),
            spanText(a.maxToAck),
          ])}
        />
      </Panel>
      <Panel title="Logbook verification">
        <Typography variant="body2" data-testid="report-logbook">
          {r.logbook.ok ? 'The chain verifies' : `The chain does not verify: ${r.logbook.problem}`}{' '}
          ({r.logbook.count} entries, checked {r.logbook.checkedAt}).
        </Typography>
        <Typography
          variant="body2"
          sx={{ fontFamily: 'monospace', wordBreak: 'break-all', mt: 0.5 }}
          data-testid="report-head-hash"
        >
          Head {r.logbook.headSeq ?? '–'}: {r.logbook.headHash ?? 'no entries'}
        </Typography>
      </Panel>
    </Box>
  );
}
