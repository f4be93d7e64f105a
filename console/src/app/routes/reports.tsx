import { useParams } from 'react-router-dom';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { ReportsScreen } from '../../features/reports/components/reports-screen';

/** Event reports of one reservoir's record. */
export function ReportsRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <ReportsScreen definition={definition} /> : null;
}
