import { useFieldArray, useForm } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { ZONE_KINDS, zoneInputSchema, type Zone, type ZoneInput } from '@stillwell/shared/notices';
import { describeError } from '../../../lib/api-client';
import { useSaveZone } from '../api/save-zone';
import { formResolver } from '../utils/zod-resolver';

export const ZONE_KIND_LABELS: Record<Zone['kind'], string> = {
  hamlet: 'Hamlet',
  'work-site': 'Work site',
  town: 'Town',
  campground: 'Campground',
  other: 'Other',
};

interface ZoneForm {
  name: string;
  kind: Zone['kind'];
  distanceM: number;
  affectedAtM3s: number;
  travelTimes: Array<{ releaseM3s: number; travelTimeMin: number }>;
}

const toInput = (f: ZoneForm): ZoneInput => ({
  name: f.name,
  kind: f.kind,
  distanceM: Number(f.distanceM),
  affectedAtM3s: Number(f.affectedAtM3s),
  travelTimes: f.travelTimes.map((r) => ({
    releaseM3s: Number(r.releaseM3s),
    travelTimeS: Number(r.travelTimeMin) * 60,
  })),
});

export interface ZoneDialogProps {
  reservoirId: string;
  zone: Zone | null;
  onClose: () => void;
}

/** A zone and its travel-time table, as the engineer enters them (minutes; the API keeps seconds). */
export function ZoneDialog({ reservoirId, zone, onClose }: ZoneDialogProps) {
  const save = useSaveZone(reservoirId);
  const form = useForm<ZoneForm>({
    resolver: formResolver(zoneInputSchema, toInput, (f) =>
      f === 'travelTimeS' ? 'travelTimeMin' : f,
    ),
    defaultValues: zone
      ? {
          ...zone,
          travelTimes: zone.travelTimes.map((r) => ({
            releaseM3s: r.releaseM3s,
            travelTimeMin: r.travelTimeS / 60,
          })),
        }
      : {
          name: '',
          kind: 'hamlet',
          distanceM: 1000,
          affectedAtM3s: 100,
          travelTimes: [{ releaseM3s: 100, travelTimeMin: 30 }],
        },
  });
  const rows = useFieldArray({ control: form.control, name: 'travelTimes' });
  const { errors } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    await save.mutateAsync({ id: zone?.id ?? null, input: toInput(values) });
    onClose();
  });
  const num = { type: 'number', slotProps: { htmlInput: { step: 'any' } } } as const;
  return (
    <Dialog open onClose={onClose} maxWidth="sm" fullWidth>
      <form onSubmit={(e) => void submit(e)} noValidate>
        <DialogTitle>{zone ? `Zone: ${zone.name}` : 'New zone below the dam'}</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1 }}>
          <TextField
            label="Name"
            sx={{ mt: 1 }}
            {...form.register('name')}
            error={Boolean(errors.name)}
            helperText={errors.name?.message}
          />
          <TextField
            select
            label="Kind"
            defaultValue={form.getValues('kind')}
            {...form.register('kind')}
          >
            {ZONE_KINDS.map((k) => (
              <MenuItem key={k} value={k}>
                {ZONE_KIND_LABELS[k]}
              </MenuItem>
            ))}
          </TextField>
          <TextField
            label="Distance below the dam, m"
            {...num}
            {...form.register('distanceM')}
            error={Boolean(errors.distanceM)}
            helperText={errors.distanceM?.message}
          />
          <TextField
            label="Affected from a release of, m3/s"
            {...num}
            {...form.register('affectedAtM3s')}
            error={Boolean(errors.affectedAtM3s)}
            helperText={errors.affectedAtM3s?.message}
          />
          <Typography variant="h3" component="h3">
            Flood-wave travel time from the dam
          </Typography>
          {rows.fields.map((field, i) => (
            <Box key={field.id} sx={{ display: 'flex', gap: 1, alignItems: 'flex-start' }}>
              <TextField
                label={`Row ${i + 1}: release, m3/s`}
                {...num}
                {...form.register(`travelTimes.${i}.releaseM3s`)}
                error={Boolean(errors.travelTimes?.[i]?.releaseM3s)}
                helperText={errors.travelTimes?.[i]?.releaseM3s?.message}
              />
              <TextField
                label="travel time, min"
                {...num}
                {...form.register(`travelTimes.${i}.travelTimeMin`)}
                error={Boolean(errors.travelTimes?.[i]?.travelTimeMin)}
                helperText={errors.travelTimes?.[i]?.travelTimeMin?.message}
              />
              <Button onClick={() => rows.remove(i)} disabled={rows.fields.length === 1}>
                Remove
              </Button>
            </Box>
          ))}
          <Button onClick={() => rows.append({ releaseM3s: 0, travelTimeMin: 0 })}>
            Add a row
          </Button>
          {errors.travelTimes?.root?.message && (
            <Alert severity="error">{errors.travelTimes.root.message}</Alert>
          )}
          {save.isError && <Alert severity="error">{describeError(save.error)}</Alert>}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained">
            Save zone
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
