import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  createUserResponseSchema,
  resetPasswordResponseSchema,
  userSchema,
  type CreateUserRequest,
  type CreateUserResponse,
  type ResetPasswordRequest,
  type UpdateUserRequest,
  type User,
} from '@stillwell/shared/access';
import { usersKeys } from './keys';
import { apiSend } from './send';

/** A new account with a one-time temporary password (the gateway asks for a recent step-up). */
export function createUser(body: CreateUserRequest): Promise<CreateUserResponse> {
  return apiSend('POST', '/api/users', body, createUserResponseSchema);
}

/** Roles, display name, or disabled (disabling ends every session of the account at once). */
export function updateUser(id: string, body: UpdateUserRequest): Promise<User> {
  return apiSend('PATCH', `/api/users/${encodeURIComponent(id)}`, body, userSchema);
}

/** A one-time temporary password; the account's sessions end. */
export async function resetPassword(id: string, body: ResetPasswordRequest): Promise<string> {
  const path = `/api/users/${encodeURIComponent(id)}/reset-password`;
  return (await apiSend('POST', path, body, resetPasswordResponseSchema)).temporaryPassword;
}

function useInvalidateUsers() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: usersKeys.all() });
}

export function useCreateUser() {
  const onSettled = useInvalidateUsers();
  return useMutation({ mutationFn: createUser, onSettled });
}

export function useUpdateUser() {
  const onSettled = useInvalidateUsers();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: UpdateUserRequest }) => updateUser(id, body),
    onSettled,
  });
}

export function useResetPassword() {
  const onSettled = useInvalidateUsers();
  return useMutation({
    mutationFn: ({ id, body }: { id: string; body: ResetPasswordRequest }) =>
      resetPassword(id, body),
    onSettled,
  });
}
