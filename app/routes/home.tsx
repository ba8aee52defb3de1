import { Link } from 'react-router-dom';
import { Page } from '../components/ui/page';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useHome } from '../features/home/api';
import { HomeLists } from '../features/home/components/home-lists';

const ROLE_JOBS: Record<string, string> = {
  admin: 'Add users, set their roles and deactivate accounts.',
  lead: 'Keep the catalog and the shop settings; decide which template versions may be released.',
  programmer: 'Build templates from the catalog and prepare jobs.',
  reviewer: 'Compare template versions and sign them off.',
  operator: 'Read setup sheets and record measured bars at the machine.',
};

/** What waits for the signed-in person, by role (GET /api/home). */
export function HomeRoute() {
  const me = useMe();
  const home = useHome(me.data?.id);
  const role = me.data?.role ?? 'operator';
  return (
    <Page title={`Welcome, ${me.data?.name ?? ''}`} subtitle={`Signed in as ${role}: ${ROLE_JOBS[role]}`}>
      <ErrorText error={home.error} />
      {home.data ? <HomeLists home={home.data} /> : home.isPending ? <p className="text-slate-700">Loading what waits for you…</p> : null}
      {role === 'admin' ? <p><Link className="font-semibold text-accent-700 underline" to="/admin/users">Users and roles</Link></p> : null}
    </Page>
  );
}
