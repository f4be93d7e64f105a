import { Link as RouterLink, Navigate } from 'react-router-dom';
import Link from '@mui/material/Link';
import List from '@mui/material/List';
import ListItem from '@mui/material/ListItem';
import Typography from '@mui/material/Typography';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { Panel } from '../../components/ui/panel';
import { ErrorMessage, LoadingMessage } from '../../components/ui/state-message';
import { paths } from '../../config/paths';
import { useReservoirs } from '../../features/reservoirs/api/get-reservoirs';
import { describeError } from '../../lib/api-client';

/** Opens the only reservoir straight away; with several, lets the operator choose. */
export function HomeRoute() {
  const reservoirs = useReservoirs();
  const only = reservoirs.data?.length === 1 ? reservoirs.data[0] : undefined;
  if (only) return <Navigate to={paths.overview.getHref(only.id)} replace />;

  return (
    <ConsoleShell nav={[]}>
      {reservoirs.isPending && <LoadingMessage label="Loading reservoirs…" />}
      {reservoirs.isError && (
        <ErrorMessage
          title="The reservoirs could not be loaded."
          detail={describeError(reservoirs.error)}
        />
      )}
      {reservoirs.data && (
        <Panel title="Reservoirs">
          {reservoirs.data.length === 0 ? (
            <Typography sx={{ color: 'text.secondary' }}>No reservoir is set up yet.</Typography>
          ) : (
            <List dense>
              {reservoirs.data.map((r) => (
                <ListItem key={r.id}>
                  <Link component={RouterLink} to={paths.overview.getHref(r.id)}>
                    {r.name} · {r.damName}
                  </Link>
                </ListItem>
              ))}
            </List>
          )}
        </Panel>
      )}
    </ConsoleShell>
  );
}
