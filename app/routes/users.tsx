import { Page } from '../components/ui/page';
import { UsersAdmin } from '../features/admin/components/users-admin';

export function UsersRoute() {
  return (
    <Page title="Users" subtitle="Who may sign in, and in which role.">
      <UsersAdmin />
    </Page>
  );
}
