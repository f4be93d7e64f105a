import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChangePasswordRequest } from '@stillwell/shared/access';
import { authKeys } from './keys';
import { reloadMe } from './get-me';
import { apiSend } from './send';

/** Changes one's own password; the gateway ends every other session of the account. */
export function changePassword(body: ChangePasswordRequest): Promise<void> {
  return apiSend('POST', '/api/auth/password', body, null);
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (body: ChangePasswordRequest) => {
      await changePassword(body);
      // mustChangePassword is now false: the rest of the console opens
      await reloadMe();
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: authKeys.sessions() }),
  });
}
