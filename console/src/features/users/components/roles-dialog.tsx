import { Controller, useForm } from 'react-hook-form';
import { z } from 'zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import { displayNameSchema, rolesSchema, type Role, type User } from '@stillwell/shared/access';
import { describeError } from '../../../lib/api-client';
import { useUpdateUser } from '../api/change-user';
import type { RunConfirmed } from '../utils/run-confirmed';
import { zodResolver } from '../utils/zod-resolver';
import { RolesField } from './roles-field';

const fieldsSchema = z.object({ displayName: displayNameSchema, roles: rolesSchema });
type Fields = { displayName: string; roles: Role[] };

export interface RolesDialogProps {
  user: User;
  withStepUp: RunConfirmed;
  onClose: () => void;
}

/** Change an account's roles and name; the change holds from the account's next request. */
export function RolesDialog({ user, withStepUp, onClose }: RolesDialogProps) {
  const update = useUpdateUser();
  const form = useForm<Fields>({
    resolver: zodResolver(fieldsSchema),
    defaultValues: { displayName: user.displayName, roles: [...user.roles] },
  });
  const { errors } = form.formState;

  const submit = form.handleSubmit(async ({ displayName, roles }) => {
    try {
      const body = {
        roles,
        ...(displayName !== user.displayName ? { displayName } : {}),
      };
      const changed = await withStepUp(`Changing ${user.username}'s roles`, () =>
        update.mutateAsync({ id: user.id, body }),
      );
      if (changed) onClose();
    } catch (error) {
      form.setError('root', { message: describeError(error) });
    }
  });

  return (
    <Dialog open onClose={onClose} aria-labelledby="roles-title">
      <form onSubmit={(e) => void submit(e)} noValidate data-testid="edit-roles">
        <DialogTitle id="roles-title">Roles of {user.username}</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1, width: 480, maxWidth: '100%' }}>
          <TextField
            label="Full name"
            {...form.register('displayName')}
            error={!!errors.displayName}
            helperText={errors.displayName?.message}
          />
          <Controller
            control={form.control}
            name="roles"
            render={({ field, fieldState }) => (
              <RolesField
                value={field.value}
                onChange={field.onChange}
                error={fieldState.error?.message}
              />
            )}
          />
          {errors.root && <Alert severity="error">{errors.root.message}</Alert>}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="contained" disabled={form.formState.isSubmitting}>
            Save
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
