import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPost } from '../../../lib/api-client';
import { enc, noticesKeys } from './keys';

const ackSchema = z.object({ recorded: z.boolean(), acknowledgedAt: z.number() });

export function acknowledgeRelease(recipientId: string) {
  return apiPost(`/api/notices/mine/${enc(recipientId)}/acknowledge`, {}, ackSchema);
}

export function useAcknowledgeRelease() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (recipientId: string) => acknowledgeRelease(recipientId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: noticesKeys.mine() }),
  });
}
