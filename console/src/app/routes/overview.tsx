import { useMemo } from 'react';
import { useParams } from 'react-router-dom';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { ForecastReadouts } from '../../features/forecasts/components/forecast-readouts';
import { useLatestForecast } from '../../features/forecasts/api/get-latest-forecast';
import { useLiveForecast } from '../../features/forecasts/hooks/use-live-forecast';
import { useSiteNow } from '../../features/forecasts/hooks/use-site-now';
import { FORECAST_AHEAD_S, forecastBand } from '../../features/forecasts/utils/band-data';
import { useReservoir } from '../../features/reservoirs/api/get-reservoir';
import { useReservoirStatus } from '../../features/telemetry/api/get-reservoir-status';
import { OverviewScreen } from '../../features/telemetry/components/overview-screen';
import { useUnitSystem } from '../../hooks/use-unit-system';
import { describeError } from '../../lib/api-client';

/** The layout has loaded the definition before this renders; it is read from the cache. */
export function OverviewRoute() {
  const { reservoirId = '' } = useParams();
  const definition = useReservoir(reservoirId).data?.definition;
  return definition ? <OverviewWithForecast definition={definition} /> : null;
}

/** The live overview with the forecast composed in: its readouts and its band on the chart. */
function OverviewWithForecast({ definition }: { definition: ReservoirDefinition }) {
  const [system] = useUnitSystem();
  const status = useReservoirStatus(definition.id);
  const { issue } = useLiveForecast(definition.id);
  const forecast = useLatestForecast(definition.id);
  const siteNow = useSiteNow(status.data?.clock, status.dataUpdatedAt);
  const run = forecast.data?.run ?? null;
  // cut at the status clock, which moves once a push, not at the ticking one: a steady chart
  const statusNow = status.data?.clock.now ?? null;
  const band = useMemo(
    () =>
      run && statusNow !== null ? forecastBand(run, system, statusNow, FORECAST_AHEAD_S) : null,
    [run, system, statusNow],
  );
  return (
    <OverviewScreen
      definition={definition}
      forecast={{
        band,
        readouts: (
          <ForecastReadouts
            update={forecast.data}
            siteNowMs={siteNow}
            system={system}
            timeZone={definition.timeZone}
            error={forecast.isError ? describeError(forecast.error) : issue}
          />
        ),
      }}
    />
  );
}
