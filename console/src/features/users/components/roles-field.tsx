import Checkbox from '@mui/material/Checkbox';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormGroup from '@mui/material/FormGroup';
import FormHelperText from '@mui/material/FormHelperText';
import FormLabel from '@mui/material/FormLabel';
import Typography from '@mui/material/Typography';
import { ROLE_LABELS, ROLES, type Role } from '@stillwell/shared/access';

export interface RolesFieldProps {
  value: readonly Role[];
  onChange: (roles: Role[]) => void;
  error?: string;
}

/** One checkbox per role, with what the role is for; kept in the matrix's order. */
export function RolesField({ value, onChange, error }: RolesFieldProps) {
  const toggle = (role: Role, on: boolean) =>
    onChange(ROLES.filter((r) => (r === role ? on : value.includes(r))));
  return (
    <FormControl error={!!error} component="fieldset">
      <FormLabel component="legend">Roles</FormLabel>
      <FormGroup>
        {ROLES.map((role) => (
          <FormControlLabel
            key={role}
            control={
              <Checkbox
                checked={value.includes(role)}
                onChange={(e) => toggle(role, e.target.checked)}
                slotProps={{ input: { 'aria-label': ROLE_LABELS[role].title } as object }}
              />
            }
            label={
              <span>
                {ROLE_LABELS[role].title}
                <Typography
                  component="span"
                  variant="body2"
                  sx={{ display: 'block', color: 'text.secondary' }}
                >
                  {ROLE_LABELS[role].description}
                </Typography>
              </span>
            }
            sx={{ alignItems: 'flex-start', '& .MuiCheckbox-root': { pt: 0.5 } }}
          />
        ))}
      </FormGroup>
      {error && <FormHelperText>{error}</FormHelperText>}
    </FormControl>
  );
}
