import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { ROLE_LABELS, type Me } from '@stillwell/shared/access';
import { Panel } from '../../../components/ui/panel';
import { useStepUp } from '../hooks/use-step-up';
import { ChangePasswordForm } from './change-password-form';
import { SecondFactorPanel } from './second-factor-panel';
import { SessionsPanel } from './sessions-panel';

export interface ProfileScreenProps {
  me: Me;
}

/** One's own account: who and which roles, the password, the second factor, the sessions. */
export function ProfileScreen({ me }: ProfileScreenProps) {
  const { withStepUp, dialog } = useStepUp();
  return (
    <Box
      sx={{
        display: 'grid',
        gap: 2,
        gridTemplateColumns: { xs: '1fr', lg: 'minmax(0, 1fr) minmax(0, 1fr)' },
        alignItems: 'start',
      }}
    >
      <Box sx={{ display: 'grid', gap: 2 }}>
        <Panel title="Your account">
          <Box
            component="dl"
            sx={{ m: 0, display: 'grid', gridTemplateColumns: 'auto 1fr', gap: 1 }}
          >
            <Typography component="dt" sx={{ color: 'text.secondary' }}>
              Name
            </Typography>
            <Typography component="dd" sx={{ m: 0 }} data-testid="profile-name">
              {me.displayName}
            </Typography>
            <Typography component="dt" sx={{ color: 'text.secondary' }}>
              Username
            </Typography>
            <Typography component="dd" sx={{ m: 0 }}>
              {me.username}
            </Typography>
            <Typography component="dt" sx={{ color: 'text.secondary' }}>
              Roles
            </Typography>
            <Box component="dd" sx={{ m: 0, display: 'grid', gap: 1 }}>
              {me.roles.map((role) => (
                <Box key={role} sx={{ display: 'flex', gap: 1, alignItems: 'baseline' }}>
                  <Chip size="small" variant="outlined" label={ROLE_LABELS[role].title} />
                  <Typography variant="body2" sx={{ color: 'text.secondary' }}>
                    {ROLE_LABELS[role].description}
                  </Typography>
                </Box>
              ))}
            </Box>
          </Box>
          <Typography variant="body2" sx={{ color: 'text.secondary', mt: 2 }}>
            Roles are given by an administrator.
          </Typography>
        </Panel>
        <Panel title="Password">
          <ChangePasswordForm me={me} />
        </Panel>
      </Box>
      <Box sx={{ display: 'grid', gap: 2 }}>
        <SecondFactorPanel me={me} withStepUp={withStepUp} />
        <SessionsPanel />
      </Box>
      {dialog}
    </Box>
  );
}
