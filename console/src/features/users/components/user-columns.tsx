import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import type { GridColDef } from '@mui/x-data-grid';
import { ROLE_LABELS, type User } from '@stillwell/shared/access';
import type { AccountAction } from './account-action-dialog';

export type RowAction = AccountAction | 'roles';

const day = (iso: string) =>
  new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }).format(
    new Date(iso),
  );

/** The accounts grid's columns; the last one holds the actions on the row's account. */
export function userColumns(onAction: (user: User, action: RowAction) => void): GridColDef<User>[] {
  return [
    { field: 'username', headerName: 'Username', width: 150 },
    { field: 'displayName', headerName: 'Name', flex: 1.5, minWidth: 200 },
    {
      field: 'roles',
      headerName: 'Roles',
      flex: 1,
      minWidth: 220,
      sortable: false,
      valueGetter: (roles: User['roles']) => roles.map((r) => ROLE_LABELS[r].title).join(', '),
      renderCell: ({ row }) => (
        <Box
          sx={{ display: 'flex', gap: 0.5, alignItems: 'center', height: '100%', flexWrap: 'wrap' }}
        >
          {row.roles.map((r) => (
            <Chip key={r} size="small" variant="outlined" label={ROLE_LABELS[r].title} />
          ))}
        </Box>
      ),
    },
    {
      field: 'disabled',
      headerName: 'Account',
      width: 110,
      renderCell: ({ row }) =>
        row.disabled ? <Chip size="small" color="warning" label="Disabled" /> : 'Active',
    },
    {
      field: 'totpEnabled',
      headerName: 'Second factor',
      width: 120,
      valueFormatter: (on: boolean) => (on ? 'On' : 'Off'),
    },
    {
      field: 'mustChangePassword',
      headerName: 'Password',
      width: 120,
      valueFormatter: (temporary: boolean) => (temporary ? 'Temporary' : 'Own'),
    },
    { field: 'createdAt', headerName: 'Created', width: 120, valueFormatter: day },
    {
      field: 'actions',
      headerName: '',
      width: 330,
      sortable: false,
      filterable: false,
      disableColumnMenu: true,
      renderCell: ({ row }) => (
        <Box sx={{ display: 'flex', gap: 0.5, alignItems: 'center', height: '100%' }}>
          <Button
            size="small"
            onClick={() => onAction(row, 'roles')}
            data-testid={`user-${row.username}-roles`}
          >
            Roles
          </Button>
          <Button
            size="small"
            color={row.disabled ? 'primary' : 'warning'}
            onClick={() => onAction(row, row.disabled ? 'enable' : 'disable')}
            data-testid={`user-${row.username}-${row.disabled ? 'enable' : 'disable'}`}
          >
            {row.disabled ? 'Enable' : 'Disable'}
          </Button>
          <Button
            size="small"
            onClick={() => onAction(row, 'reset')}
            data-testid={`user-${row.username}-reset`}
          >
            Reset password
          </Button>
        </Box>
      ),
    },
  ];
}
