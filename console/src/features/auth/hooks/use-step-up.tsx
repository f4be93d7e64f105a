import { useCallback, useRef, useState, type ReactNode } from 'react';
import { ApiError } from '../../../lib/api-client';
import { session } from '../../../lib/auth-session';
import { StepUpDialog } from '../components/step-up-dialog';

/** Runs an authorising act, asking for the password (and code) first where the gateway will. */
export type WithStepUp = <T>(purpose: string, run: () => Promise<T>) => Promise<T | null>;

/** Within this margin of its end a step-up is renewed first rather than risked. */
const MARGIN_MS = 15_000;

function steppedUp(): boolean {
  const until = session()?.me.stepUpUntil;
  return until ? Date.parse(until) - Date.now() > MARGIN_MS : false;
}

/**
 * The step-up flow for a screen: `withStepUp` resolves to null when the person cancels; render
 * `dialog` once on the screen. Without a console session the act is simply tried.
 */
export function useStepUp(): { withStepUp: WithStepUp; dialog: ReactNode } {
  const [purpose, setPurpose] = useState<string | null>(null);
  const answer = useRef<((ok: boolean) => void) | null>(null);

  const ask = useCallback(
    (why: string) =>
      new Promise<boolean>((resolve) => {
        answer.current = resolve;
        setPurpose(why);
      }),
    [],
  );
  const close = (ok: boolean) => {
    setPurpose(null);
    answer.current?.(ok);
    answer.current = null;
  };

  const withStepUp = useCallback<WithStepUp>(
    async (why, run) => {
      if (session() && !steppedUp() && !(await ask(why))) return null;
      try {
        return await run();
      } catch (error) {
        if (!(error instanceof ApiError && error.code === 'step-up-required')) throw error;
        if (!(await ask(why))) return null;
        return run();
      }
    },
    [ask],
  );

  const dialog = (
    <StepUpDialog
      open={purpose !== null}
      purpose={purpose ?? ''}
      onConfirmed={() => close(true)}
      onCancel={() => close(false)}
    />
  );
  return { withStepUp, dialog };
}
