import { Controller, useForm } from 'react-hook-form';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import {
  createUserRequestSchema,
  type CreateUserRequest,
  type CreateUserResponse,
} from '@stillwell/shared/access';
import { ApiError, describeError } from '../../../lib/api-client';
import { useCreateUser } from '../api/change-user';
import type { RunConfirmed } from '../utils/run-confirmed';
import { zodResolver } from '../utils/zod-resolver';
import { RolesField } from './roles-field';

export interface CreateUserDialogProps {
  withStepUp: RunConfirmed;
  onCreated: (created: CreateUserResponse) => void;
  onClose: () => void;
}

/** A new account: the gateway makes a temporary password, to be changed at first sign-in. */
export function CreateUserDialog({ withStepUp, onCreated, onClose }: CreateUserDialogProps) {
  const create = useCreateUser();
  const form = useForm<CreateUserRequest>({
    resolver: zodResolver(createUserRequestSchema),
    defaultValues: { username: '', displayName: '', roles: [] },
  });
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (body) => {
    try {
      const created = await withStepUp('Creating an account', () => create.mutateAsync(body));
      if (created) onCreated(created);
    } catch (error) {
      if (error instanceof ApiError && error.code === 'username-taken')
        form.setError('username', { message: 'an account has this username already' });
      else form.setError('root', { message: describeError(error) });
    }
  });

  return (
    <Dialog open onClose={onClose} aria-labelledby="create-user-title">
      <form onSubmit={(e) => void submit(e)} noValidate data-testid="create-user">
        <DialogTitle id="create-user-title">New account</DialogTitle>
        <DialogContent sx={{ display: 'grid', gap: 2, pt: 1, width: 480, maxWidth: '100%' }}>
          <TextField
            label="Username"
            autoFocus
            autoComplete="off"
            {...form.register('username')}
            error={!!errors.username}
            helperText={
              errors.username?.message ?? "2-64 characters: letters, digits, '.', '_' or '-'"
            }
          />
          <TextField
            label="Full name"
            autoComplete="off"
            {...form.register('displayName')}
            error={!!errors.displayName}
            // the shared schema's own wording is zod's default, which names no field
            helperText={
              errors.displayName
                ? 'Full name: give 1 to 100 characters'
                : 'as the logbook will show it'
            }
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
          <Button
            type="submit"
            variant="contained"
            disabled={form.formState.isSubmitting}
            data-testid="create-user-submit"
          >
            Create account
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
