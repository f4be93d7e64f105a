import { useMemo } from 'react';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { controlsOf, orderImpact, type Order } from '@stillwell/shared/orders';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ReservoirStatus } from '@stillwell/shared/telemetry';
import { useWallClock } from '../../../hooks/use-wall-clock';
import { describeError } from '../../../lib/api-client';
import { useCreateOrder } from '../api/order-actions';
import { draftProblems, emptyDraft, emptyStep, toRequest, type DraftValues } from '../utils/draft';
import { ImpactSummary } from './impact-summary';

export interface DraftOrderFormProps {
  definition: ReservoirDefinition;
  status: ReservoirStatus | undefined;
  onDrafted: (order: Order) => void;
  onCancel: () => void;
}

/**
 * Drafting a gate operation: targets per step, the reason, when. The routed effect is computed
 * here in the browser with the shared hydraulics as it is typed, the same function the gateway
 * runs when the draft is stored (where the current forecast run is attached).
 */
export function DraftOrderForm({ definition, status, onDrafted, onCancel }: DraftOrderFormProps) {
  const controls = useMemo(() => controlsOf(definition), [definition]);
  const form = useForm<DraftValues>({ defaultValues: emptyDraft(definition) });
  const steps = useFieldArray({ control: form.control, name: 'steps' as never });
  const values = useWatch({ control: form.control }) as DraftValues;
  const create = useCreateOrder(definition.id);
  const wall = useWallClock(10_000);
  const siteNow = status?.clock.now ?? wall;
  const request = toRequest(values, siteNow);
  const problems = draftProblems(request, definition);

  const openings: Record<string, number> = {};
  for (const c of controls) {
    const s = status?.channels.find((x) => x.channel === c.channel);
    if (s) openings[c.id] = s.value;
  }
  const preview =
    problems.length === 0 && status?.pool
      ? orderImpact({
          definition,
          pool: status.pool.elevation,
          openings,
          steps: request.steps,
          inflow: status.inflow,
        })
      : null;

  const submit = form.handleSubmit(() => {
    if (problems.length) return;
    create.mutate(request, { onSuccess: (order) => onDrafted(order) });
  });

  return (
    <Box
      component="form"
      onSubmit={submit}
      sx={{ display: 'grid', gap: 1.5 }}
      data-testid="draft-order-form"
      noValidate
    >
      <Typography variant="h2" component="h3">
        Draft a gate operation
      </Typography>
      {steps.fields.map((field, i) => (
        <Box
          key={field.id}
          sx={{ display: 'grid', gap: 1, p: 1, border: 1, borderColor: 'divider', borderRadius: 1 }}
        >
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
            <Typography variant="body2" sx={{ flexGrow: 1 }}>
              Step {i + 1}
            </Typography>
            <TextField
              label="Minutes after execution"
              size="small"
              type="number"
              disabled={i === 0}
              {...form.register(`steps.${i}.offsetMin` as const)}
              sx={{ width: 190 }}
            />
            {i > 0 && (
              <Button size="small" onClick={() => steps.remove(i)}>
                Remove step
              </Button>
            )}
          </Box>
          <Box
            sx={{
              display: 'grid',
              gridTemplateColumns: 'repeat(auto-fill, minmax(170px, 1fr))',
              gap: 1,
            }}
          >
            {controls.map((c) => {
              const now = openings[c.id];
              return (
                <TextField
                  key={c.id}
                  size="small"
                  type="number"
                  label={`${c.label.replace(/ \(.*\)$/, '')} (${c.unit})`}
                  helperText={`0–${c.max} ${c.unit}; now ${now === undefined ? '—' : now.toFixed(c.unit === 'm' ? 2 : 1)}`}
                  {...form.register(`steps.${i}.targets.${c.id}` as const)}
                  slotProps={{
                    htmlInput: { step: 'any', 'data-testid': `draft-target-${i}-${c.id}` },
                  }}
                />
              );
            })}
          </Box>
        </Box>
      ))}
      <Box>
        <Button
          size="small"
          onClick={() => {
            const last = Number(values.steps.at(-1)?.offsetMin ?? 0);
            steps.append(emptyStep((Number.isFinite(last) ? last : 0) + 30, controls) as never);
          }}
        >
          Add a later step (schedule)
        </Button>
      </Box>
      <Box sx={{ display: 'flex', gap: 1 }}>
        <TextField
          label="Planned start, minutes from now"
          type="number"
          size="small"
          {...form.register('startInMin')}
          sx={{ width: 240 }}
        />
      </Box>
      <TextField
        label="Reason"
        multiline
        minRows={2}
        {...form.register('reason')}
        slotProps={{ htmlInput: { 'data-testid': 'draft-reason' } }}
      />
      <Box sx={{ p: 1, bgcolor: 'background.default', borderRadius: 1 }}>
        <Typography variant="body2" color="text.secondary" gutterBottom>
          Routed effect of this draft (before it is submitted)
        </Typography>
        {preview ? (
          <ImpactSummary impact={preview} when="now" />
        ) : (
          <Typography variant="body2" color="text.secondary">
            {status?.pool
              ? 'Complete the draft to see its effect.'
              : 'No fresh pool reading: the effect cannot be computed.'}
          </Typography>
        )}
      </Box>
      {problems.length > 0 && form.formState.isSubmitted && (
        <Alert severity="warning" data-testid="draft-problems">
          <Box component="ul" sx={{ m: 0, pl: 2 }}>
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </Box>
        </Alert>
      )}
      {create.isError && <Alert severity="error">{describeError(create.error)}</Alert>}
      <Box sx={{ display: 'flex', gap: 1 }}>
        <Button
          type="submit"
          variant="contained"
          disabled={create.isPending}
          data-testid="draft-submit"
        >
          Submit for review
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </Box>
    </Box>
  );
}
