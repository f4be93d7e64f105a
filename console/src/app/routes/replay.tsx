import { useParams } from 'react-router-dom';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { ReplayScreen } from '../../features/replay/components/replay-screen';

/** The replay of a past window of one reservoir's record. */
export function ReplayRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <ReplayScreen definition={definition} /> : null;
}
