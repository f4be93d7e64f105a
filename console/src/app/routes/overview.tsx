import { useParams } from 'react-router-dom';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { OverviewScreen } from '../../features/telemetry/components/overview-screen';

/** The layout has loaded the definition before this renders; it is read from the cache. */
export function OverviewRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <OverviewScreen definition={definition} /> : null;
}
