import Box from '@mui/material/Box';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ReservoirStatus } from '@stillwell/shared/telemetry';
import type { UnitSystem } from '@stillwell/shared/units';
import { Readout } from '../../../components/ui/readout';
import { formatQuantity } from '../../../lib/format';
import { channelByRole, doubtOf, type ChannelView, type Doubt } from '../utils/channel-health';
import { freeboardSeverity, poolStanding } from '../utils/thresholds';

export interface KeyReadoutsProps {
  definition: ReservoirDefinition;
  status: ReservoirStatus;
  channels: readonly ChannelView[];
  system: UnitSystem;
}

const SOUND: Doubt = { stale: false, quality: 'good' };

/** The numbers a shift watches first: pool, freeboard, inflow, outflow, rate of rise. */
export function KeyReadouts({ definition, status, channels, system }: KeyReadoutsProps) {
  const pool = status.pool;
  const source = pool ? channels.find((c) => c.id === pool.source) : undefined;
  // A derived number is only as sound as the gauge it came from.
  const poolDoubt = pool ? doubtOf(source) : { stale: true, quality: null };
  const flowDoubt = (role: 'inflow' | 'outflow') => {
    const channel = channelByRole(channels, role);
    return channel ? doubtOf(channel) : SOUND;
  };
  const length = (si: number) => formatQuantity(si, 'length', system);
  const flow = (si: number) => formatQuantity(si, 'flow', system);
  const standing = pool ? poolStanding(pool.elevation, definition.thresholds) : null;
  const crest = length(definition.damCrestElevation);
  const unitOf = (shown: { unitText: string }) => shown.unitText;

  return (
    <Box
      sx={{
        display: 'grid',
        gap: 1.5,
        gridTemplateColumns: 'repeat(auto-fit, minmax(170px, 1fr))',
      }}
    >
      <Readout
        label="Pool elevation"
        valueTestId="pool-elevation"
        value={pool ? length(pool.elevation).text : null}
        unit={unitOf(length(0))}
        severity={standing?.severity}
        {...poolDoubt}
        caption={
          pool
            ? [
                source?.label ?? pool.source,
                standing?.exceeded && `above ${standing.exceeded.label}`,
              ]
                .filter(Boolean)
                .join(' · ')
            : 'No pool gauge reporting'
        }
      />
      <Readout
        label="Freeboard"
        valueTestId="freeboard"
        value={pool ? length(pool.freeboard).text : null}
        unit={unitOf(length(0))}
        severity={pool ? freeboardSeverity(pool.freeboard, definition) : 'normal'}
        {...poolDoubt}
        caption={`to dam crest ${crest.text} ${crest.unitText}`}
      />
      <Readout
        label="Inflow"
        valueTestId="inflow"
        value={status.inflow === null ? null : flow(status.inflow).text}
        unit={unitOf(flow(0))}
        {...(status.inflow === null ? { stale: true, quality: null } : flowDoubt('inflow'))}
      />
      <Readout
        label="Outflow"
        valueTestId="outflow"
        value={status.outflow === null ? null : flow(status.outflow).text}
        unit={unitOf(flow(0))}
        {...(status.outflow === null ? { stale: true, quality: null } : flowDoubt('outflow'))}
      />
      <Readout
        label="Rate of rise"
        valueTestId="rate-of-rise"
        value={
          pool?.rateOfRise == null
            ? null
            : formatQuantity(pool.rateOfRise, 'riseRate', system, { signed: true }).text
        }
        unit={formatQuantity(0, 'riseRate', system).unitText}
        {...poolDoubt}
        caption={
          pool && pool.rateOfRise === null ? 'not enough readings yet' : '+ rising, − falling'
        }
      />
    </Box>
  );
}
