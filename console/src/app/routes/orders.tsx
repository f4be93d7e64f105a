import { useParams } from 'react-router-dom';
import { OrdersScreen } from '../../features/orders/components/orders-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { useReservoirStatus } from '../../features/telemetry/api/get-reservoir-status';

/** Gate orders. The layout keeps the status live; it is handed to the orders feature from here. */
export function OrdersRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  const status = useReservoirStatus(reservoirId).data;
  return definition ? <OrdersScreen definition={definition} status={status} /> : null;
}
