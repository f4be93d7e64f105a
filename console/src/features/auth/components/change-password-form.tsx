import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import TextField from '@mui/material/TextField';
import { newPasswordSchema, type Me } from '@stillwell/shared/access';
import { ApiError, describeError } from '../../../lib/api-client';
import { useChangePassword } from '../api/change-password';
import { passwordRuleHint, rejectedPasswordText } from '../utils/password-text';
import { zodResolver } from '../utils/zod-resolver';

export interface ChangePasswordFormProps {
  me: Pick<Me, 'username' | 'roles'>;
  /** the label of the current password: "Temporary password" after an administrator's reset */
  currentLabel?: string;
  onChanged?: () => void;
}

interface Fields {
  currentPassword: string;
  newPassword: string;
  repeat: string;
}

/** The shared rules (NIST SP 800-63B, shared/src/access/password.ts), checked here and again by the gateway. */
function fieldsSchema(me: ChangePasswordFormProps['me']): z.ZodType<Fields> {
  return z
    .object({
      currentPassword: z.string().min(1, 'your current password'),
      newPassword: newPasswordSchema({ roles: me.roles, username: me.username }),
      repeat: z.string(),
    })
    .refine((v) => v.newPassword === v.repeat, {
      path: ['repeat'],
      message: 'the two new passwords differ',
    });
}

/** Change one's own password; every other session of the account ends. */
export function ChangePasswordForm({ me, currentLabel, onChanged }: ChangePasswordFormProps) {
  const resolver = useMemo(() => zodResolver(fieldsSchema(me)), [me]);
  const form = useForm<Fields>({
    resolver,
    defaultValues: { currentPassword: '', newPassword: '', repeat: '' },
  });
  const change = useChangePassword();
  const [done, setDone] = useState(false);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async ({ currentPassword, newPassword }) => {
    setDone(false);
    try {
      await change.mutateAsync({ currentPassword, newPassword });
      form.reset();
      setDone(true);
      onChanged?.();
    } catch (error) {
      const rejected = rejectedPasswordText(error, me.roles);
      if (rejected) form.setError('newPassword', { message: rejected });
      else if (error instanceof ApiError && error.code === 'wrong-password')
        form.setError('currentPassword', { message: 'this is not your current password' });
      else form.setError('root', { message: describeError(error) });
    }
  });

  return (
    <Box
      component="form"
      noValidate
      onSubmit={(e) => void submit(e)}
      data-testid="change-password"
      sx={{ display: 'grid', gap: 2, maxWidth: 420 }}
    >
      <TextField
        label={currentLabel ?? 'Current password'}
        type="password"
        autoComplete="current-password"
        {...form.register('currentPassword')}
        error={!!errors.currentPassword}
        helperText={errors.currentPassword?.message}
      />
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        {...form.register('newPassword')}
        error={!!errors.newPassword}
        helperText={errors.newPassword?.message ?? passwordRuleHint(me.roles)}
        slotProps={{ formHelperText: { 'data-testid': 'new-password-help' } as object }}
      />
      <TextField
        label="New password again"
        type="password"
        autoComplete="new-password"
        {...form.register('repeat')}
        error={!!errors.repeat}
        helperText={errors.repeat?.message}
      />
      {errors.root && <Alert severity="error">{errors.root.message}</Alert>}
      {done && (
        <Alert severity="success">
          Password changed. Every other session of your account has been ended.
        </Alert>
      )}
      <Box>
        <Button type="submit" variant="contained" disabled={form.formState.isSubmitting}>
          Change password
        </Button>
      </Box>
    </Box>
  );
}
