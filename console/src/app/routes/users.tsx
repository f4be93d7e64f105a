import { ConsoleShell } from '../../components/layouts/console-shell';
import { RequirePermission } from '../../features/auth/components/require-permission';
import { useHomeNav } from '../../features/auth/hooks/use-home-nav';
import { useStepUp } from '../../features/auth/hooks/use-step-up';
import { UsersScreen } from '../../features/users/components/users-screen';

/** The administrator's accounts page; the step-up comes from the sign-in feature. */
export function UsersRoute() {
  const { withStepUp, dialog } = useStepUp();
  return (
    <ConsoleShell reservoirName="Users and roles" nav={useHomeNav()}>
      <title>Users · Stillwell</title>
      <RequirePermission action="users.manage">
        <UsersScreen withStepUp={withStepUp} />
        {dialog}
      </RequirePermission>
    </ConsoleShell>
  );
}
