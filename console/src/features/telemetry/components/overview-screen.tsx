import type { ReactNode } from 'react';
import Box from '@mui/material/Box';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { useUnitSystem } from '../../../hooks/use-unit-system';
import { describeError } from '../../../lib/api-client';
import { formatNumber } from '../../../lib/format';
import { useReservoirStatus } from '../api/get-reservoir-status';
import { useStatusFreshness } from '../hooks/use-status-freshness';
import { buildGaugeModel } from '../utils/gauge-model';
import { describeChannels, doubtOf } from '../utils/channel-health';
import { ChannelTable } from './channel-table';
import type { ChartForecast } from './chart-options';
import { KeyReadouts } from './key-readouts';
import { LevelInflowPanel } from './level-inflow-panel';
import { PoolGauge } from './pool-gauge';

export interface OverviewScreenProps {
  definition: ReservoirDefinition;
  /**
   * The forecast, composed by the route from the forecasts feature: its readouts (shown under
   * the key numbers) and its band for the chart.
   */
  forecast?: { readouts: ReactNode; band: ChartForecast | null };
}

/** The live overview of one reservoir. */
export function OverviewScreen({ definition, forecast }: OverviewScreenProps) {
  const [system] = useUnitSystem();
  const statusQuery = useReservoirStatus(definition.id);
  const freshness = useStatusFreshness(statusQuery.data, statusQuery.dataUpdatedAt);

  if (statusQuery.isPending) return <LoadingMessage label="Loading the reservoir's status…" />;
  if (statusQuery.isError) {
    return (
      <ErrorMessage
        title="The reservoir's status could not be loaded."
        detail={describeError(statusQuery.error)}
      />
    );
  }

  const status = statusQuery.data;
  const channels = describeChannels(definition, status, freshness.overdueSiteS);
  const pool = status.pool;
  const poolDoubt = pool
    ? doubtOf(channels.find((c) => c.id === pool.source))
    : { stale: true, quality: null };
  const { stored, quarantined, gaps } = status.ingestion;

  return (
    <Stack spacing={2}>
      {freshness.overdue && (
        <Typography role="alert" sx={{ color: 'signal.doubt', fontWeight: 500 }}>
          No status has arrived for a while: every value below is marked stale until one does.
        </Typography>
      )}
      <Box
        sx={{
          display: 'grid',
          gap: 2,
          gridTemplateColumns: {
            xs: '1fr',
            lg: '320px minmax(0, 1fr)',
            xl: '360px minmax(0, 1fr)',
          },
          alignItems: 'start',
        }}
      >
        <Panel title="Pool scale">
          <PoolGauge
            model={buildGaugeModel(definition, pool?.elevation ?? null, system)}
            {...poolDoubt}
          />
        </Panel>
        <Stack spacing={2} sx={{ minWidth: 0 }}>
          <KeyReadouts
            definition={definition}
            status={status}
            channels={channels}
            system={system}
          />
          {forecast?.readouts}
          <LevelInflowPanel
            definition={definition}
            status={status}
            system={system}
            forecast={forecast?.band ?? null}
          />
          <Panel
            title="Gauges"
            aside={
              <Typography variant="body2" sx={{ color: 'text.secondary' }}>
                stored <Typography variant="numeric">{formatNumber(stored, 0)}</Typography> ·
                quarantined{' '}
                <Typography
                  variant="numeric"
                  sx={{ color: quarantined > 0 ? 'signal.caution' : 'inherit' }}
                >
                  {formatNumber(quarantined, 0)}
                </Typography>{' '}
                · gaps{' '}
                <Typography
                  variant="numeric"
                  sx={{ color: gaps > 0 ? 'signal.caution' : 'inherit' }}
                >
                  {formatNumber(gaps, 0)}
                </Typography>
              </Typography>
            }
          >
            <ChannelTable channels={channels} system={system} />
          </Panel>
        </Stack>
      </Box>
    </Stack>
  );
}
