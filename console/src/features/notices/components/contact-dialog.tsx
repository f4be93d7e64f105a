import { useForm } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import {
  CONTACT_DEFAULTS,
  contactInputSchema,
  type Contact,
  type ContactInput,
  type Zone,
} from '@stillwell/shared/notices';
import { describeError } from '../../../lib/api-client';
import { useSaveContact } from '../api/save-contact';
import { formResolver } from '../utils/zod-resolver';

interface ContactForm {
  zoneId: string;
  organisation: string;
  person: string;
  role: string;
  email: string;
  phone: string;
  leadTimeMin: number;
  escalationOrder: number;
  ackWindowMin: number;
  userId: string;
  active: boolean;
}

const toInput = (f: ContactForm): ContactInput => ({
  zoneId: f.zoneId,
  organisation: f.organisation,
  person: f.person,
  role: f.role,
  email: f.email,
  phone: f.phone,
  leadTimeS: Math.round(Number(f.leadTimeMin) * 60),
  escalationOrder: Number(f.escalationOrder),
  ackWindowS: Math.round(Number(f.ackWindowMin) * 60),
  userId: f.userId.trim() || null,
  active: f.active,
});
const FIELD: Record<string, string> = { leadTimeS: 'leadTimeMin', ackWindowS: 'ackWindowMin' };

export interface ContactDialogProps {
  reservoirId: string;
  zones: readonly Zone[];
  contact: Contact | null;
  onClose: () => void;
}

/** A person to tell, with the lead time they need and their place in the zone's chain. */
export function ContactDialog({ reservoirId, zones, contact, onClose }: ContactDialogProps) {
  const save = useSaveContact(reservoirId);
  const form = useForm<ContactForm>({
    resolver: formResolver(contactInputSchema, toInput, (f) => FIELD[f] ?? f),
    defaultValues: contact
      ? {
          ...contact,
          leadTimeMin: contact.leadTimeS / 60,
          ackWindowMin: contact.ackWindowS / 60,
          userId: contact.userId ?? '',
        }
      : {
          zoneId: zones[0]?.id ?? '',
          organisation: '',
          person: '',
          role: '',
          email: '',
          phone: '',
          leadTimeMin: CONTACT_DEFAULTS.leadTimeS / 60,
          escalationOrder: CONTACT_DEFAULTS.escalationOrder,
          ackWindowMin: CONTACT_DEFAULTS.ackWindowS / 60,
          userId: '',
          active: true,
        },
  });
  const { errors } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    await save.mutateAsync({ id: contact?.id ?? null, input: toInput(values) });
    onClose();
  });
  const text = (name: keyof ContactForm, label: string, extra: object = {}) => (
    <TextField
      label={label}
      {...extra}
      {...form.register(name)}
      error={Boolean(errors[name])}
      helperText={errors[name]?.message}
    />
  );
  return (
    <Dialog open onClose={onClose} maxWidth="sm" fullWidth>
      <form onSubmit={(e) => void submit(e)} noValidate>
        <DialogTitle>
          {contact ? `Contact: ${contact.person}` : 'New downstream contact'}
        </DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1 }}>
          <TextField
            select
            label="Zone"
            sx={{ mt: 1 }}
            defaultValue={form.getValues('zoneId')}
            {...form.register('zoneId')}
            error={Boolean(errors.zoneId)}
            helperText={errors.zoneId?.message}
          >
            {zones.map((z) => (
              <MenuItem key={z.id} value={z.id}>
                {z.name}
              </MenuItem>
            ))}
          </TextField>
          {text('organisation', 'Organisation')}
          {text('person', 'Person')}
          {text('role', 'Role')}
          {text('email', 'E-mail', { type: 'email' })}
          {text('phone', 'Phone')}
          {text('leadTimeMin', 'Lead time needed before a release, min', { type: 'number' })}
          {text('escalationOrder', 'Place in the escalation chain (1 is told first)', {
            type: 'number',
          })}
          {text('ackWindowMin', 'Time to acknowledge before the next is told, min', {
            type: 'number',
          })}
          {text('userId', 'Stakeholder sign-in (account id; empty: none)')}
          <FormControlLabel
            control={
              <Checkbox defaultChecked={form.getValues('active')} {...form.register('active')} />
            }
            label="Active: tell this person"
          />
          {save.isError && <Alert severity="error">{describeError(save.error)}</Alert>}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained">
            Save contact
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
