import { useState } from 'react';
import { Link } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { TextField } from '../components/ui/field';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { usePlates } from '../features/catalog/api';
import { PlatesTable } from '../features/catalog/components/plates-table';
import type { Plate } from '../../shared/schemas/catalog';

const NONE: Plate[] = [];

export function PlatesRoute() {
  const me = useMe();
  const plates = usePlates();
  const [filter, setFilter] = useState('');
  return (
    <Page title="Plates" subtitle="Grid fixture plates and bushed tables: hole grid, pitch and datum hole (0, 0) at the front-left."
      actions={may(me.data?.role, 'editCatalog') ? <Link to="/catalog/plates/new" className="inline-flex min-h-10 items-center rounded bg-accent-700 px-4 font-semibold text-white hover:bg-accent-800">Add plate</Link> : null}>
      <div className="max-w-sm"><TextField label="Filter plates" placeholder="code or name" value={filter} onChange={(e) => setFilter(e.target.value)} /></div>
      <ErrorText error={plates.error} />
      {plates.isPending ? <p>Loading plates…</p> : <PlatesTable plates={plates.data?.items ?? NONE} filter={filter} />}
    </Page>
  );
}
