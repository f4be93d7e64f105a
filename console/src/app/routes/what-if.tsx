import { useParams } from 'react-router-dom';
import { useCan } from '../../features/auth/hooks/use-can';
import { useLatestForecast } from '../../features/forecasts/api/get-latest-forecast';
import { WhatIfScreen } from '../../features/forecasts/components/what-if-screen';
import { useLiveForecast } from '../../features/forecasts/hooks/use-live-forecast';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { useReservoirStatus } from '../../features/telemetry/api/get-reservoir-status';
import { useUnitSystem } from '../../hooks/use-unit-system';

/**
 * What-if: two gate schedules routed on one inflow. The layout keeps the status live (the pool the
 * run starts from); the latest forecast is kept live here, for "start from the live forecast".
 * The screen needs forecast.read (RESERVOIR_SCREENS); running one needs forecast.run.
 */
export function WhatIfRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  const status = useReservoirStatus(reservoirId).data;
  const [system] = useUnitSystem();
  const canRun = useCan('forecast.run');
  useLiveForecast(reservoirId);
  const forecast = useLatestForecast(reservoirId);
  if (!definition) return null;
  return (
    <WhatIfScreen
      definition={definition}
      system={system}
      currentPool={status?.pool?.elevation ?? null}
      forecast={forecast.data?.run ?? null}
      canRun={canRun}
    />
  );
}
