import { useParams } from 'react-router-dom';
import { AlarmRatesScreen } from '../../features/alarms/components/alarm-rates-screen';
import { AlarmsScreen } from '../../features/alarms/components/alarms-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/** The alarm list; the layout has loaded the definition before this renders. */
export function AlarmsRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <AlarmsScreen definition={definition} /> : null;
}

/** How the alarm system performs against the alarm-rate benchmarks. */
export function AlarmRatesRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <AlarmRatesScreen definition={definition} /> : null;
}
