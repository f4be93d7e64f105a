import { Link as RouterLink } from 'react-router-dom';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import { ConsoleShell } from '../../components/layouts/console-shell';
import { paths } from '../../config/paths';

export function NotFoundRoute() {
  return (
    <ConsoleShell nav={[]}>
      <Typography sx={{ p: 2 }}>
        There is no such screen.{' '}
        <Link component={RouterLink} to={paths.home.getHref()}>
          Back to the reservoirs
        </Link>
      </Typography>
    </ConsoleShell>
  );
}
