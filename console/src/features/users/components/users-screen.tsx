import { useMemo, useState } from 'react';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { DataGrid } from '@mui/x-data-grid';
import type { User } from '@stillwell/shared/access';
import { Panel } from '../../../components/ui/panel';
import { ErrorMessage } from '../../../components/ui/state-message';
import { describeError } from '../../../lib/api-client';
import { useUsers } from '../api/get-users';
import type { RunConfirmed } from '../utils/run-confirmed';
import { AccountActionDialog } from './account-action-dialog';
import { CreateUserDialog } from './create-user-dialog';
import { RolesDialog } from './roles-dialog';
import { TemporaryPasswordDialog } from './temporary-password-dialog';
import { userColumns, type RowAction } from './user-columns';

export interface UsersScreenProps {
  withStepUp: RunConfirmed;
}

type Open =
  | { kind: 'create' }
  | { kind: RowAction; user: User }
  | { kind: 'secret'; username: string; password: string };

/** The administrator's accounts: create, give roles, disable or enable, reset a password. */
export function UsersScreen({ withStepUp }: UsersScreenProps) {
  const users = useUsers();
  const [open, setOpen] = useState<Open | null>(null);
  const columns = useMemo(() => userColumns((user, kind) => setOpen({ kind, user })), []);
  const close = () => setOpen(null);

  return (
    <Panel
      title="Accounts"
      aside={
        <Button
          variant="contained"
          size="small"
          onClick={() => setOpen({ kind: 'create' })}
          data-testid="new-user"
        >
          New account
        </Button>
      }
    >
      <Typography variant="body2" sx={{ color: 'text.secondary', mb: 1.5 }}>
        Every change here needs your password again and is recorded in the logbook. Disabling an
        account ends its sessions at once.
      </Typography>
      {users.isError ? (
        <ErrorMessage
          title="The accounts could not be loaded."
          detail={describeError(users.error)}
        />
      ) : (
        <Box data-testid="users-grid">
          <DataGrid
            aria-label="Accounts"
            rows={users.data ?? []}
            columns={columns}
            loading={users.isPending}
            density="compact"
            autoHeight
            disableRowSelectionOnClick
            pageSizeOptions={[25, 50, 100]}
            initialState={{
              pagination: { paginationModel: { pageSize: 25 } },
              sorting: { sortModel: [{ field: 'username', sort: 'asc' }] },
            }}
          />
        </Box>
      )}
      {open?.kind === 'create' && (
        <CreateUserDialog
          withStepUp={withStepUp}
          onClose={close}
          onCreated={({ user, temporaryPassword }) =>
            setOpen({ kind: 'secret', username: user.username, password: temporaryPassword })
          }
        />
      )}
      {open?.kind === 'roles' && (
        <RolesDialog user={open.user} withStepUp={withStepUp} onClose={close} />
      )}
      {(open?.kind === 'disable' || open?.kind === 'enable' || open?.kind === 'reset') && (
        <AccountActionDialog
          user={open.user}
          action={open.kind}
          withStepUp={withStepUp}
          onClose={close}
          onReset={(password) =>
            setOpen({ kind: 'secret', username: open.user.username, password })
          }
        />
      )}
      {open?.kind === 'secret' && (
        <TemporaryPasswordDialog
          username={open.username}
          password={open.password}
          onClose={close}
        />
      )}
    </Panel>
  );
}
