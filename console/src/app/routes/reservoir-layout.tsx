import { Outlet, useParams } from 'react-router-dom';
import Alert from '@mui/material/Alert';
import { ConnectionBadge } from '../../components/ui/connection-badge';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { SiteClock } from '../../components/ui/site-clock';
import { ErrorMessage, LoadingMessage } from '../../components/ui/state-message';
import { UnitsToggle } from '../../components/ui/units-toggle';
import { paths, RESERVOIR_SCREENS } from '../../config/paths';
import { AlarmBanner } from '../../features/alarms/components/alarm-banner';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { useReservoirStatus } from '../../features/telemetry/api/get-reservoir-status';
import { useLiveReservoir } from '../../features/telemetry/hooks/use-live-reservoir';
import { useStatusFreshness } from '../../features/telemetry/hooks/use-status-freshness';
import { useUnitSystem } from '../../hooks/use-unit-system';
import { describeError } from '../../lib/api-client';
import { useLiveConnectionState } from '../../lib/live-connection';

/** The shell around one reservoir's screens; keeps that reservoir live while it is open. */
export function ReservoirLayout() {
  const { reservoirId = '' } = useParams();
  const reservoir = useReservoir(reservoirId);
  const status = useReservoirStatus(reservoirId);
  const freshness = useStatusFreshness(status.data, status.dataUpdatedAt);
  const { issue } = useLiveReservoir(reservoirId);
  const connection = useLiveConnectionState();
  const [system, setSystem] = useUnitSystem();
  const definition = reservoir.data?.definition;

  return (
    <ConsoleShell
      reservoirName={definition?.name}
      damName={definition?.damName}
      nav={RESERVOIR_SCREENS.map((screen) => ({
        label: screen.label,
        to: screen.getHref(reservoirId),
      }))}
      status={
        <>
          <AlarmBanner reservoirId={reservoirId} listHref={paths.alarms.getHref(reservoirId)} />
          {definition && (
            <SiteClock
              clock={status.data?.clock ?? null}
              timeZone={definition.timeZone}
              stale={freshness.overdue}
            />
          )}
          <ConnectionBadge state={connection} />
          <UnitsToggle value={system} onChange={setSystem} />
        </>
      }
      notice={
        issue && (
          <Alert severity="warning" variant="outlined" square sx={{ borderWidth: '0 0 1px 0' }}>
            {issue}
          </Alert>
        )
      }
    >
      {definition && <title>{`${definition.name} · Stillwell`}</title>}
      {reservoir.isPending && <LoadingMessage label="Loading the reservoir…" />}
      {reservoir.isError && (
        <ErrorMessage
          title="The reservoir could not be loaded."
          detail={describeError(reservoir.error)}
        />
      )}
      {definition && <Outlet />}
    </ConsoleShell>
  );
}
