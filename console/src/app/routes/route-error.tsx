import { useRouteError } from 'react-router-dom';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { ErrorMessage } from '../../components/ui/state-message';
import { describeError } from '../../lib/api-client';

/** What shows when a screen fails outright, instead of a blank page. */
export function RouteError() {
  const error = useRouteError();
  return (
    <ConsoleShell nav={[]}>
      <ErrorMessage
        title="This screen failed. Reload the page; if it fails again, tell support."
        detail={describeError(error)}
      />
    </ConsoleShell>
  );
}
