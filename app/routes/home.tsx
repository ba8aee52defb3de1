import { Link } from 'react-router-dom';
import { Page } from '../components/ui/page';
import { useMe } from '../features/auth/api';
import { useComponents, usePlates } from '../features/catalog/api';

const ROLE_JOBS: Record<string, string> = {
  admin: 'Add users, set their roles and deactivate accounts.',
  lead: 'Keep the catalog and the shop settings; decide which template versions may be released.',
  programmer: 'Build templates from the catalog and prepare jobs.',
  reviewer: 'Compare template versions and sign them off.',
  operator: 'Read setup sheets and record measured bars at the machine.',
};

export function HomeRoute() {
  const me = useMe();
  const plates = usePlates();
  const components = useComponents();
  const role = me.data?.role ?? 'operator';
  return (
    <Page title={`Welcome, ${me.data?.name ?? ''}`} subtitle={`Signed in as ${role}: ${ROLE_JOBS[role]}`}>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Link to="/catalog/components" className="rounded border border-slate-300 bg-white p-4 hover:border-accent-700">
          <p className="text-lg font-semibold">Components</p>
          <p className="num text-left text-3xl">{components.data?.total ?? '…'}</p>
          <p className="text-slate-600">rails, vises, stops and subplates in the catalog</p>
        </Link>
        <Link to="/catalog/plates" className="rounded border border-slate-300 bg-white p-4 hover:border-accent-700">
          <p className="text-lg font-semibold">Plates</p>
          <p className="num text-left text-3xl">{plates.data?.total ?? '…'}</p>
          <p className="text-slate-600">grid plates and bushed tables</p>
        </Link>
      </div>
    </Page>
  );
}
