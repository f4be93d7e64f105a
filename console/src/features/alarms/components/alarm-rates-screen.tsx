import { useState } from 'react';
import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { PRIORITIES, type AlarmPerformance } from '@stillwell/shared/alarms';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { formatNumber } from '../../../lib/format';
import { signal } from '../../../theme';
import { useAlarmPerformance } from '../api/get-alarm-performance';
import { useAlarms } from '../api/get-alarms';
import { priorityLabel } from '../utils/alarm-text';
import { PeriodBars } from './period-bars';

export interface AlarmRatesScreenProps {
  definition: ReservoirDefinition;
}

const RANGES = [
  { hours: 24, label: 'last 24 hours' },
  { hours: 72, label: 'last 72 hours' },
  { hours: 168, label: 'last 7 days' },
];

const VERDICT: Record<AlarmPerformance['verdict']['rate'], string> = {
  acceptable: 'within the acceptable rate (about 1 per 10 minutes)',
  manageable:
    'above the acceptable rate, within what an operator can manage (about 2 per 10 minutes)',
  overloaded: 'more than an operator can manage',
};

function Figure({
  label,
  value,
  testId,
  alarm,
}: {
  label: string;
  value: string;
  testId: string;
  alarm?: boolean;
}) {
  return (
    <Box>
      <Typography variant="body2" sx={{ color: 'text.secondary' }}>
        {label}
      </Typography>
      <Typography
        variant="h2"
        component="div"
        data-testid={testId}
        sx={{ color: alarm ? signal.alarm : undefined }}
      >
        {value}
      </Typography>
    </Box>
  );
}

/**
 * How the alarm system performs, per operator, against the ISA-18.2 and EEMUA 191 benchmarks:
 * alarms per 10 minutes, floods (10 or more in 10 minutes), the most frequent and chattering alarms.
 */
export function AlarmRatesScreen({ definition }: AlarmRatesScreenProps) {
  const [hours, setHours] = useState(24);
  const siteNow = useAlarms(definition.id).data?.siteNowMs ?? null;
  const perf = useAlarmPerformance(definition.id, hours, siteNow);
  const p = perf.data;
  return (
    <Panel
      title="Alarm rates"
      aside={
        <TextField
          select
          size="small"
          value={hours}
          onChange={(e) => setHours(Number(e.target.value))}
          label="Range"
        >
          {RANGES.map((r) => (
            <MenuItem key={r.hours} value={r.hours}>
              {r.label}
            </MenuItem>
          ))}
        </TextField>
      }
    >
      {perf.isPending && <LoadingMessage label="Counting the alarms…" />}
      {perf.isError && (
        <ErrorMessage
          title="The alarm rates could not be loaded."
          detail={describeError(perf.error)}
        />
      )}
      {p && (
        <Box sx={{ display: 'flex', flexDirection: 'column', gap: 2 }}>
          <Box sx={{ display: 'flex', gap: 4, flexWrap: 'wrap' }}>
            <Figure label="Alarms" value={String(p.total)} testId="rate-total" />
            <Figure
              label="Per 10 minutes, average"
              value={formatNumber(p.averagePer10Min, 2)}
              testId="rate-average"
              alarm={p.verdict.rate === 'overloaded'}
            />
            <Figure
              label="Most in any 10 minutes"
              value={String(p.peakPer10Min)}
              testId="rate-peak"
              alarm={p.verdict.floods}
            />
            <Figure
              label="10-minute periods in flood"
              value={`${p.floodPeriods} (${formatNumber(p.floodShare * 100, 1)} %)`}
              testId="rate-floods"
              alarm={p.floodPeriods > 0}
            />
            <Figure
              label="By priority"
              value={PRIORITIES.map((x) => `${priorityLabel(x)} ${p.byPriority[x]}`).join(' · ')}
              testId="rate-priorities"
            />
          </Box>
          <Typography data-testid="rate-verdict">
            The rate is {VERDICT[p.verdict.rate]};{' '}
            {p.verdict.floods ? 'there was a flood' : 'no flood'};{' '}
            {p.verdict.chattering ? 'some alarms chatter (below)' : 'no alarm chatters'}.
          </Typography>
          <PeriodBars periods={p.periods} />
          <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', md: '1fr 1fr' } }}>
            <Table size="small" aria-label="Most frequent alarms">
              <TableHead>
                <TableRow>
                  <TableCell>Most frequent</TableCell>
                  <TableCell align="right">Count</TableCell>
                  <TableCell align="right">Share</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {p.mostFrequent.map((m) => (
                  <TableRow key={m.conditionId}>
                    <TableCell>{m.conditionId}</TableCell>
                    <TableCell align="right">{m.count}</TableCell>
                    <TableCell align="right">{formatNumber(m.share * 100, 0)} %</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
            <Table size="small" aria-label="Chattering alarms">
              <TableHead>
                <TableRow>
                  <TableCell>Chattering (3 or more within a minute)</TableCell>
                  <TableCell align="right">Bursts</TableCell>
                  <TableCell align="right">Most in a minute</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {p.chattering.length === 0 && (
                  <TableRow>
                    <TableCell colSpan={3}>None</TableCell>
                  </TableRow>
                )}
                {p.chattering.map((c) => (
                  <TableRow key={c.conditionId}>
                    <TableCell>{c.conditionId}</TableCell>
                    <TableCell align="right">{c.bursts}</TableCell>
                    <TableCell align="right">{c.mostInAMinute}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </Box>
          <Typography variant="body2" sx={{ color: 'text.secondary' }}>
            Per operator on shift, counting alarms presented to the operator (raised while in
            service). Benchmarks after ISA-18.2 (IEC 62682) and EEMUA 191.
          </Typography>
        </Box>
      )}
    </Panel>
  );
}
