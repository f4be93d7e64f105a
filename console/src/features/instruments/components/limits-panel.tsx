import { useState } from 'react';
import Alert from '@mui/material/Alert';
import { useQueryClient } from '@tanstack/react-query';
import type { LimitsChangeResult, ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { UnitSystem } from '@stillwell/shared/units';
import { Panel } from '../../../components/ui/panel';
import { damSafetyReservoirKey } from '../api/get-dam-safety';
import { describeChange, limitFields } from '../utils/limit-fields';
import { LimitsForm, type RunConfirmed } from './limits-form';

export interface LimitsPanelProps {
  definition: ReservoirDefinition;
  version: number;
  system: UnitSystem;
  editable: boolean;
  withStepUp: RunConfirmed;
  /** fetches the definition in force again; resolves to the version it got */
  reloadDefinition: () => Promise<number | undefined>;
}

/** A fetch already under way when a change is saved may still bring the version before it. */
const RELOAD_TRIES = 3;

/**
 * Holds the limits form on the version it was opened on: a definition fetched again in the
 * background does not reset the edits. After a save, or a reload asked for, the form opens again
 * once the newer version is here. Changing the units opens it again too (its text is in units).
 */
export function LimitsPanel({ reloadDefinition, ...form }: LimitsPanelProps) {
  const queryClient = useQueryClient();
  const [opened, setOpened] = useState(0);
  const [awaiting, setAwaiting] = useState<number | null>(null);
  const [saved, setSaved] = useState<LimitsChangeResult | null>(null);
  const fields = limitFields(form.definition, form.system);
  // the version waited for has come: open the form again on it (state adjusted while rendering)
  if (awaiting !== null && form.version >= awaiting) {
    setAwaiting(null);
    setOpened((n) => n + 1);
  }

  const reopenAt = async (version: number) => {
    setAwaiting(version);
    for (let i = 0; i < RELOAD_TRIES; i++) if (((await reloadDefinition()) ?? 0) >= version) return;
  };

  return (
    <Panel title="Limits and baselines">
      {saved && (
        <Alert
          severity="success"
          data-testid="limits-saved"
          onClose={() => setSaved(null)}
          sx={{ mb: 2 }}
        >
          Saved as definition version {saved.version}:{' '}
          {saved.changes.map((c) => describeChange(fields, c)).join('; ')}
        </Alert>
      )}
      <LimitsForm
        key={`${form.system}-${opened}`}
        {...form}
        onSaved={(result) => {
          setSaved(result);
          void queryClient.invalidateQueries({
            queryKey: damSafetyReservoirKey(form.definition.id),
          });
          void reopenAt(result.version);
        }}
        onReload={(openedOn) => {
          setSaved(null);
          void reopenAt(openedOn + 1);
        }}
      />
    </Panel>
  );
}
