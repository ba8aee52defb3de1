import { useState } from 'react';
import { Link } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import type { Component } from '../../shared/schemas/catalog';
import { Page } from '../components/ui/page';
import { TextField } from '../components/ui/field';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useComponents } from '../features/catalog/api';
import { ComponentsTable } from '../features/catalog/components/components-table';
import { ManifestImport } from '../features/manifest/components/manifest-import';
import { useQueryClient } from '@tanstack/react-query';
import { catalogKeys } from '../features/catalog/api';

const NONE: Component[] = [];

export function ComponentsRoute() {
  const me = useMe();
  const components = useComponents();
  const [filter, setFilter] = useState('');
  const qc = useQueryClient();
  return (
    <Page title="Components" subtitle="The shop's fixture components: locating dowels, stop positions, jaw faces and clamp models."
      actions={may(me.data?.role, 'editCatalog') ? <Link to="/catalog/components/new" className="inline-flex min-h-10 items-center rounded bg-accent-700 px-4 font-semibold text-white hover:bg-accent-800">Add component</Link> : null}>
      <div className="max-w-sm"><TextField label="Filter components" placeholder="code, kind, name or layer" value={filter} onChange={(e) => setFilter(e.target.value)} /></div>
      <ErrorText error={components.error} />
      {components.isPending ? <p>Loading components…</p> : <ComponentsTable components={components.data?.items ?? NONE} filter={filter} />}
      <ManifestImport canWrite={may(me.data?.role, 'editCatalog')} onCommitted={() => qc.invalidateQueries({ queryKey: catalogKeys.all })} />
    </Page>
  );
}
