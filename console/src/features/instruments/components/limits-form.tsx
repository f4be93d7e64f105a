import { useCallback, useMemo, useState } from 'react';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import {
  LIMITS_NOTE_MIN,
  type LimitsChangeResult,
  type ReservoirDefinition,
} from '@stillwell/shared/reservoirs';
import type { UnitSystem } from '@stillwell/shared/units';
import { ApiError, describeError } from '../../../lib/api-client';
import { postLimitsChange } from '../api/change-limits';
import { buildLimitsChange } from '../utils/build-limits-change';
import { initialValues, limitFields } from '../utils/limit-fields';
import { placeProblems, problemsOfError, type PlacedProblems } from '../utils/limits-problems';
import { LimitInputs } from './limit-inputs';

/** Runs an act after the person confirms who they are (null when they cancel). */
export type RunConfirmed = <T>(purpose: string, run: () => Promise<T>) => Promise<T | null>;

export interface LimitsFormProps {
  /** the definition and version the form was opened on; a save is made against this version */
  definition: ReservoirDefinition;
  version: number;
  system: UnitSystem;
  editable: boolean;
  withStepUp: RunConfirmed;
  onSaved: (result: LimitsChangeResult) => void;
  /** load the definition in force again (newer than `version`), dropping this form's edits */
  onReload: (openedOn: number) => void;
}

const NONE: PlacedProblems = { fields: {}, general: [] };

/**
 * The dam-safety limits and baselines. An engineer may change them: the change is checked here
 * with the shared rules, then sent with a note, after confirming identity, as a new version of
 * the definition. Everyone else sees them read-only.
 */
export function LimitsForm(props: LimitsFormProps) {
  const { system, editable, withStepUp, onSaved, onReload } = props;
  // the form stays on what it was opened on: a newer version fetched meanwhile is a 409 at save
  const [{ definition, version }] = useState(() => ({
    definition: props.definition,
    version: props.version,
  }));
  const fields = useMemo(() => limitFields(definition, system), [definition, system]);
  const [values, setValues] = useState(() => initialValues(fields));
  const [note, setNote] = useState('');
  const [problems, setProblems] = useState<PlacedProblems>(NONE);
  const [conflict, setConflict] = useState(false);
  const [busy, setBusy] = useState(false);

  const edit = useCallback((key: string, value: string) => {
    setValues((v) => ({ ...v, [key]: value }));
    setProblems((p) => (p.fields[key] ? { ...p, fields: { ...p.fields, [key]: '' } } : p));
  }, []);

  const save = async () => {
    const built = buildLimitsChange(definition, version, fields, values, note);
    setConflict(false);
    if (!built.ok) return setProblems(built);
    setProblems(NONE);
    setBusy(true);
    try {
      const result = await withStepUp('Changing the dam-safety limits', () =>
        postLimitsChange(definition.id, built.change),
      );
      if (result) onSaved(result);
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) setConflict(true);
      else if (error instanceof ApiError && error.status === 400)
        setProblems(placeProblems(fields, problemsOfError(error)));
      else setProblems({ fields: {}, general: [describeError(error)] });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Box
      component="form"
      data-testid="limits-form"
      data-version={version}
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      sx={{ display: 'grid', gap: 2 }}
    >
      <Typography variant="body2" data-testid="limits-version" sx={{ color: 'text.secondary' }}>
        Definition version {version}.{' '}
        {editable
          ? 'A change is saved as a new version, with its note in the logbook.'
          : 'Only the duty engineer can change these limits.'}{' '}
        Limits raise alarms and draw the baselines above: they are decision support. The dam’s
        approved operating rules, its emergency action plan, local codes and the responsible
        licensed engineer prevail.
      </Typography>
      {conflict && (
        <Alert
          severity="warning"
          data-testid="limits-conflict"
          action={
            <Button color="inherit" size="small" onClick={() => onReload(version)}>
              Reload
            </Button>
          }
        >
          The definition changed since you opened it (version {version}); reload to see the limits
          in force, then make your change again. Reloading drops the edits made here.
        </Alert>
      )}
      {problems.general.length > 0 && (
        <Alert severity="error" data-testid="limits-problems">
          {problems.general.map((m) => (
            <div key={m}>{m}</div>
          ))}
        </Alert>
      )}
      <LimitInputs
        fields={fields}
        values={values}
        errors={problems.fields}
        readOnly={!editable}
        onChange={edit}
      />
      {editable && (
        <Box sx={{ display: 'flex', gap: 2, alignItems: 'flex-start' }}>
          <TextField
            size="small"
            label="Why the limits change"
            required
            value={note}
            onChange={(e) => {
              setNote(e.target.value);
              setProblems((p) => ({ ...p, fields: { ...p.fields, note: '' } }));
            }}
            error={Boolean(problems.fields.note)}
            helperText={
              problems.fields.note ||
              `kept with the version (at least ${LIMITS_NOTE_MIN} characters)`
            }
            sx={{ flexGrow: 1 }}
            slotProps={{ htmlInput: { 'data-testid': 'limits-note' } }}
          />
          <Button type="submit" variant="contained" disabled={busy} data-testid="limits-save">
            Save limits
          </Button>
        </Box>
      )}
    </Box>
  );
}
