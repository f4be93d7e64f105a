import { useCallback, useState } from 'react';
import { ApiError } from '../../../lib/api-client';

/**
 * Runs an act that may need identity confirmed again: when the gateway answers
 * step-up-required, the dialog opens and the act is tried again once confirmed.
 */
export function useSteppedUp() {
  const [pending, setPending] = useState<{ purpose: string; retry: () => void } | null>(null);
  const run = useCallback(
    (purpose: string, act: (onStepUpNeeded: (error: unknown) => boolean) => void) => {
      const onError = (error: unknown) => {
        if (error instanceof ApiError && error.code === 'step-up-required') {
          setPending({ purpose, retry: () => act(() => false) });
          return true;
        }
        return false;
      };
      act(onError);
    },
    [],
  );
  return {
    run,
    dialog: {
      open: pending !== null,
      purpose: pending?.purpose ?? '',
      onConfirmed: () => {
        const retry = pending?.retry;
        setPending(null);
        retry?.();
      },
      onCancel: () => setPending(null),
    },
  };
}
