import { useParams } from 'react-router-dom';
import { HeadPrintPage } from '../../features/logbook/components/head-print-page';
import { LogbookScreen } from '../../features/logbook/components/logbook-screen';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';

/** The logbook: one for the whole gateway, shown in the site's time zone. */
export function LogbookRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <LogbookScreen definition={definition} /> : null;
}

/** The head hash on a sheet of its own, without the console's frame, to print and keep. */
export function LogbookHeadPrintRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? (
    <>
      <title>Logbook head · Stillwell</title>
      <HeadPrintPage damName={definition.damName} timeZone={definition.timeZone} />
    </>
  ) : null;
}
