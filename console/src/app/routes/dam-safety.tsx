import { useParams } from 'react-router-dom';
import { DamSafetyScreen } from '../../features/instruments/components/dam-safety-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/** Seepage weirs and foundation piezometers against the pool. */
export function DamSafetyRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <DamSafetyScreen definition={definition} /> : null;
}
