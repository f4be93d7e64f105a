import { useParams } from 'react-router-dom';
import { LogbookScreen } from '../../features/logbook/components/logbook-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/** The logbook: one for the whole gateway, shown in the site's time zone. */
export function LogbookRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <LogbookScreen definition={definition} /> : null;
}
