import { useState } from 'react';
import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../../components/ui/state-message';
import { useUnitSystem } from '../../../hooks/use-unit-system';
import { describeError } from '../../../lib/api-client';
import { formatNumber } from '../../../lib/format';
import { signal } from '../../../theme';
import { useDamSafety } from '../api/get-dam-safety';
import { PiezometerPanel, WeirPanel } from './instrument-panels';
import { LimitsPanel } from './limits-panel';
import type { RunConfirmed } from './limits-form';

export interface DamSafetyScreenProps {
  definition: ReservoirDefinition;
  /** the definition's version, which a change of limits is made against */
  version: number;
  /** may this person change the limits (the gateway decides in the end) */
  canEditLimits: boolean;
  withStepUp: RunConfirmed;
  reloadDefinition: () => Promise<number | undefined>;
}

const RANGES = [1, 3, 7, 30];

/**
 * Seepage and foundation pressure against the pool and over time, with their limits and
 * baselines from the definition, and the water balance: the early signs of a dam changing its
 * behaviour. Limits and baselines change only through a new version of the definition (the
 * limits panel below, for the engineer).
 */
export function DamSafetyScreen({
  definition,
  version,
  canEditLimits,
  withStepUp,
  reloadDefinition,
}: DamSafetyScreenProps) {
  const [days, setDays] = useState(7);
  const [system] = useUnitSystem();
  const q = useDamSafety(definition.id, days);
  const d = q.data;
  const mb = d?.massBalance ?? null;
  // plots span the record there is, not an empty week before a young record
  const firsts = d
    ? [d.pool.t[0], ...d.weirs.map((w) => w.t[0]), ...d.piezometers.map((p) => p.t[0])].filter(
        (t): t is number => t !== undefined,
      )
    : [];
  const fromMs = d ? Math.max(d.fromMs, Math.min(d.toMs - 3_600_000, ...firsts)) : 0;
  return (
    <Box sx={{ display: 'flex', flexDirection: 'column', gap: 2 }}>
      <Panel
        title="Dam safety"
        aside={
          <TextField
            select
            size="small"
            label="Range"
            value={days}
            onChange={(e) => setDays(Number(e.target.value))}
          >
            {RANGES.map((n) => (
              <MenuItem key={n} value={n}>
                last {n} day{n === 1 ? '' : 's'}
              </MenuItem>
            ))}
          </TextField>
        }
      >
        {q.isPending && <LoadingMessage label="Loading the instruments…" />}
        {q.isError && (
          <ErrorMessage
            title="The instruments could not be loaded."
            detail={describeError(q.error)}
          />
        )}
        {d && (
          <Typography
            data-testid="mass-balance"
            sx={{
              color: mb && Math.abs(mb.residualFlow) > mb.tolerance ? signal.alarm : undefined,
            }}
          >
            {mb
              ? `Water balance over the last ${formatNumber((mb.toMs - mb.fromMs) / 3_600_000, 1)} h: ${formatNumber(mb.residualFlow, 2, true)} m³/s ${mb.residualFlow < 0 ? 'unaccounted for (leaving)' : 'more than measured'}, tolerance ${formatNumber(mb.tolerance, 2)} m³/s (definition version ${d.definitionVersion}).`
              : 'Water balance: not enough record yet (it needs the last 3 hours of pool, inflow and outflow).'}
          </Typography>
        )}
      </Panel>
      {d && (
        <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: { xs: '1fr', lg: '1fr 1fr' } }}>
          {d.weirs.map((s) => (
            <WeirPanel
              key={s.weir.id}
              s={s}
              fromMs={fromMs}
              toMs={d.toMs}
              timeZone={definition.timeZone}
              system={system}
            />
          ))}
          {d.piezometers.map((s) => (
            <PiezometerPanel
              key={s.piezometer.id}
              s={s}
              fromMs={fromMs}
              toMs={d.toMs}
              timeZone={definition.timeZone}
              system={system}
            />
          ))}
        </Box>
      )}
      <LimitsPanel
        definition={definition}
        version={version}
        system={system}
        editable={canEditLimits}
        withStepUp={withStepUp}
        reloadDefinition={reloadDefinition}
      />
    </Box>
  );
}
