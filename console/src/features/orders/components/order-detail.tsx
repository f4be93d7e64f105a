import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { Me } from '@stillwell/shared/access';
import {
  controlsOf,
  ORDER_STATE_LABELS,
  type Emergency,
  type Order,
} from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { formatSiteTime } from '../../../lib/format';
import { useInterlocks } from '../api/get-order';
import { describeTargets } from '../utils/draft';
import { ImpactSummary } from './impact-summary';
import { OrderActionsBar } from './order-actions-bar';
import { OrderStateChip } from './order-state-chip';

export interface OrderDetailProps {
  order: Order;
  definition: ReservoirDefinition;
  me: Me | null;
  emergency: Emergency | null;
  siteNowMs: number;
}

function Line({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: '150px 1fr', gap: 1 }}>
      <Typography variant="body2" color="text.secondary">
        {label}
      </Typography>
      <Typography variant="body2" component="div">
        {children}
      </Typography>
    </Box>
  );
}

/** One order with everything the reviewer and the operator need, and what they may do now. */
export function OrderDetail({ order, definition, me, emergency, siteNowMs }: OrderDetailProps) {
  const controls = controlsOf(definition);
  const at = (iso: string | null) => {
    if (!iso) return '—';
    const t = formatSiteTime(Date.parse(iso), definition.timeZone);
    return `${t.time} ${t.zone}, ${t.date}`;
  };
  const checkable = ['proposed', 'authorised', 'holding'].includes(order.state);
  const interlocks = useInterlocks(order.id, checkable);
  return (
    <Box
      sx={{ display: 'grid', gap: 1.5 }}
      data-testid="order-detail"
      data-order-id={order.id}
      data-state={order.state}
    >
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}>
        <Typography variant="h2" component="h3">
          Order {order.id}
        </Typography>
        <OrderStateChip state={order.state} />
        {order.emergency && <Chip color="error" size="small" label="Emergency action" />}
        {order.awaitingCountersign && (
          <Chip color="warning" size="small" variant="outlined" label="Awaiting countersignature" />
        )}
      </Box>
      {order.fault && (
        <Alert severity="error" data-testid="order-fault">
          {order.fault.code}: {order.fault.detail}
        </Alert>
      )}
      <Line label="Moves">
        {order.steps.map((s, i) => (
          <div key={i}>
            {order.steps.length > 1 ? `Step ${i + 1} at +${s.offsetMin} min: ` : ''}
            {describeTargets(s.targets, controls)}
          </div>
        ))}
      </Line>
      <Line label="Reason">{order.reason}</Line>
      <Line label="Drafted">
        {order.author.username}, {at(order.createdAt)}; planned start {at(order.plannedStart)}
      </Line>
      <Line label="Forecast">
        {order.forecast
          ? `Run ${order.forecast.runId} (${at(order.forecast.issuedAt)}): ${order.forecast.summary}`
          : 'No forecast run was attached'}
      </Line>
      <Line label="Routed effect">
        <ImpactSummary impact={order.impact} when="when it was drafted" />
      </Line>
      {order.decision && (
        <Line label={order.decision.outcome === 'authorised' ? 'Authorised' : 'Declined'}>
          {order.decision.by.username}, {at(order.decision.at)}: “{order.decision.comment}”
          {order.authorisedUntil && order.state === 'authorised'
            ? ` — runs out at ${at(order.authorisedUntil)}`
            : ''}
        </Line>
      )}
      {order.execution && (
        <Line label="Sent to the gates">
          {order.execution.by.username}, {at(order.execution.at)}
          {order.execution.waived.length
            ? `; waived under the emergency: ${order.execution.waived.join(', ')}`
            : ''}
          <Typography variant="caption" component="div" color="text.secondary">
            Downstream: {order.execution.clearance}
          </Typography>
        </Line>
      )}
      {order.countersign && (
        <Line label="Countersigned">
          {order.countersign.by.username}, {at(order.countersign.at)}: “{order.countersign.comment}”
        </Line>
      )}
      {order.withdrawal && (
        <Line label="Withdrawn">
          {order.withdrawal.by.username}, {at(order.withdrawal.at)}: “{order.withdrawal.comment}”
        </Line>
      )}
      {order.commands.length > 0 && (
        <Table size="small" aria-label="Commands">
          <TableHead>
            <TableRow>
              <TableCell>Command</TableCell>
              <TableCell>State</TableCell>
              <TableCell>Sent</TableCell>
              <TableCell>Answered</TableCell>
              <TableCell>In position</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {order.commands.map((c) => (
              <TableRow key={c.commandId} data-testid="order-command" data-state={c.state}>
                <TableCell sx={{ fontFamily: 'monospace' }}>{c.commandId}</TableCell>
                <TableCell>
                  {c.state}
                  {c.reason ? `: ${c.reason}` : ''}
                </TableCell>
                <TableCell>{at(c.sentAt)}</TableCell>
                <TableCell>{at(c.ackAt)}</TableCell>
                <TableCell>{at(c.confirmedAt)}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
      {checkable && interlocks.data && (
        <Box data-testid="order-interlocks">
          <Typography variant="body2" color="text.secondary">
            Interlocks now ({interlocks.data.ok ? 'nothing refuses' : 'would refuse'}):
          </Typography>
          <Box component="ul" sx={{ m: 0, pl: 2 }}>
            {interlocks.data.results.map((r) => (
              <Typography
                component="li"
                variant="body2"
                key={r.code}
                sx={{ color: r.ok ? 'text.secondary' : r.waived ? 'warning.main' : 'error.main' }}
              >
                {r.ok ? 'ok' : r.waived ? 'waived' : 'refuses'} — {r.message}
              </Typography>
            ))}
          </Box>
        </Box>
      )}
      {me && <OrderActionsBar order={order} me={me} emergency={emergency} siteNowMs={siteNowMs} />}
      <Typography variant="caption" color="text.secondary">
        State: {ORDER_STATE_LABELS[order.state]}. The gateway enforces the two-person rule and the
        interlocks; this screen only shows them.
      </Typography>
    </Box>
  );
}
