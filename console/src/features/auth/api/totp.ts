import { useMutation } from '@tanstack/react-query';
import { totpBeginResponseSchema, type TotpBeginResponse } from '@stillwell/shared/access';
import { reloadMe } from './get-me';
import { apiSend } from './send';

/** A new key with its QR code (needs a recent step-up); nothing changes until it is confirmed. */
export function beginTotp(): Promise<TotpBeginResponse> {
  return apiSend('POST', '/api/auth/totp/begin', undefined, totpBeginResponseSchema);
}

export function useConfirmTotp() {
  return useMutation({
    mutationFn: async (code: string) => {
      await apiSend('POST', '/api/auth/totp/confirm', { code }, null);
      await reloadMe();
    },
  });
}

/** Turns the second factor off (needs a recent step-up). */
export async function removeTotp(): Promise<void> {
  await apiSend('POST', '/api/auth/totp/remove', undefined, null);
  await reloadMe();
}
