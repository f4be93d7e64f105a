import { useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { ACTIVE_STATES } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ReservoirStatus } from '@stillwell/shared/telemetry';
import { Panel } from '../../../components/ui/panel';
import { useWallClock } from '../../../hooks/use-wall-clock';
import { describeError } from '../../../lib/api-client';
import { useEmergency } from '../api/get-emergency';
import { useMe } from '../api/get-me';
import { useOrder } from '../api/get-order';
import { useAwaitingCountersign, useOrders } from '../api/get-orders';
import { useLiveOrders } from '../hooks/use-live-orders';
import { AutomationPanel } from './automation-panel';
import { DraftOrderForm } from './draft-order-form';
import { EmergencyBanner } from './emergency-banner';
import { OrderDetail } from './order-detail';
import { OrderList } from './order-list';

export interface OrdersScreenProps {
  definition: ReservoirDefinition;
  /** the live status (pool, gate positions): the draft's effect is computed from it */
  status: ReservoirStatus | undefined;
}

/** Gate operations: drafting, review, sending, the countersign list and the automatic rules. */
export function OrdersScreen({ definition, status }: OrdersScreenProps) {
  const { issue, alarms } = useLiveOrders(definition.id);
  const orders = useOrders(definition.id);
  const awaiting = useAwaitingCountersign(definition.id);
  const emergency = useEmergency(definition.id).data?.emergency ?? null;
  const me = useMe().data ?? null;
  const wall = useWallClock(10_000);
  const [selected, setSelected] = useState<number | null>(null);
  const [drafting, setDrafting] = useState(false);
  const order = useOrder(selected);
  const all = orders.data ?? [];
  const may = (a: string) =>
    (me?.permissions as readonly string[] | undefined)?.includes(a) ?? false;
  const open = all.filter(
    (o) => o.state === 'proposed' || o.state === 'authorised' || ACTIVE_STATES.includes(o.state),
  );
  const closed = all.filter((o) => !open.includes(o));

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <EmergencyBanner
        reservoirId={definition.id}
        timeZone={definition.timeZone}
        emergency={emergency}
        me={me}
      />
      {issue && <Alert severity="warning">{issue}</Alert>}
      {alarms.slice(0, 3).map((a) => (
        <Alert
          key={`${a.orderId}-${a.kind}-${a.at}`}
          severity="error"
          data-testid="order-alarm"
          onClick={() => setSelected(a.orderId)}
        >
          Order {a.orderId}:{' '}
          {a.kind === 'order.ack-missing'
            ? 'no acknowledgement'
            : a.kind === 'order.not-following'
              ? 'the gate does not follow'
              : 'the controller refused'}{' '}
          — {a.detail}
        </Alert>
      ))}
      <Box
        sx={{
          display: 'grid',
          gridTemplateColumns: { xs: '1fr', lg: '5fr 7fr' },
          gap: 2,
          alignItems: 'start',
        }}
      >
        <Box sx={{ display: 'grid', gap: 2 }}>
          <Panel
            title="Open orders"
            aside={
              may('orders.draft') && (
                <Button
                  size="small"
                  variant="contained"
                  onClick={() => {
                    setDrafting(true);
                    setSelected(null);
                  }}
                  data-testid="draft-open"
                >
                  Draft a gate operation
                </Button>
              )
            }
          >
            {orders.isError && <Alert severity="error">{describeError(orders.error)}</Alert>}
            <OrderList
              orders={open}
              definition={definition}
              selected={selected}
              onSelect={(id) => {
                setSelected(id);
                setDrafting(false);
              }}
              empty="No order is open."
              testId="open-orders"
            />
          </Panel>
          <Panel title="Awaiting countersignature">
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              Emergency actions sent without prior authorisation (or with checks waived) until a
              duty engineer countersigns them.
            </Typography>
            <OrderList
              orders={awaiting.data ?? []}
              definition={definition}
              selected={selected}
              onSelect={(id) => {
                setSelected(id);
                setDrafting(false);
              }}
              empty="Nothing awaits countersignature."
              testId="countersign-list"
            />
          </Panel>
          <Panel title="Closed orders">
            <OrderList
              orders={closed.slice(0, 30)}
              definition={definition}
              selected={selected}
              onSelect={(id) => {
                setSelected(id);
                setDrafting(false);
              }}
              empty="None yet."
              testId="closed-orders"
            />
          </Panel>
        </Box>
        <Panel title={drafting ? 'New order' : 'Order'}>
          {drafting ? (
            <DraftOrderForm
              definition={definition}
              status={status}
              onDrafted={(o) => {
                setDrafting(false);
                setSelected(o.id);
              }}
              onCancel={() => setDrafting(false)}
            />
          ) : order.data ? (
            <OrderDetail
              order={order.data}
              definition={definition}
              me={me}
              emergency={emergency}
              siteNowMs={status?.clock.now ?? wall}
            />
          ) : (
            <Typography variant="body2" color="text.secondary">
              Choose an order to see it with its forecast, routed effect and interlocks.
            </Typography>
          )}
        </Panel>
      </Box>
      <Panel title="Automatic rules">
        <AutomationPanel definition={definition} me={me} />
      </Panel>
    </Box>
  );
}
