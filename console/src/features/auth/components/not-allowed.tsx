import { Link as RouterLink } from 'react-router-dom';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Link from '@mui/material/Link';
import { ACTION_DESCRIPTIONS, ROLE_LABELS, type Action } from '@stillwell/shared/access';
import { paths } from '../../../config/paths';
import { useSession } from '../../../lib/auth-session';

export interface NotAllowedProps {
  /** what the screen needs */
  action: Action;
}

/** What a person sees on a screen their roles do not open: why, and the way back. */
export function NotAllowed({ action }: NotAllowedProps) {
  const roles = useSession()?.me.roles ?? [];
  const held = roles.map((r) => ROLE_LABELS[r].title).join(', ') || 'no role';
  return (
    <Alert severity="warning" variant="outlined" sx={{ m: 2 }} data-testid="not-allowed">
      <AlertTitle>Not allowed</AlertTitle>
      This screen is for people who may {ACTION_DESCRIPTIONS[action]}. Your roles ({held}) do not
      allow that. If you need it, ask an administrator.{' '}
      <Link component={RouterLink} to={paths.home.getHref()}>
        Back to the start
      </Link>
    </Alert>
  );
}
