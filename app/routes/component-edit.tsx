import { useNavigate, useParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import type { Component } from '../../shared/schemas/catalog';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useComponent, useDeleteComponent } from '../features/catalog/api';
import { ComponentForm } from '../features/catalog/components/component-form';
import { ComponentOutline } from '../features/catalog/components/component-outline';
import { OutlineImport } from '../features/catalog/components/outline-import';
import { useConvention } from '../features/naming/api';

/**
 * A stored outline or new dowels reload the form, so saving it cannot put the old outline back.
 * updatedAt alone is not enough: it has whole-second resolution, and the dowels are often set
 * within a second of the outline.
 */
function formKey(c: Component): string {
  return `${c.id}:${c.updatedAt}:${c.outlineFile?.sha256 ?? ''}:${JSON.stringify([c.dowels, c.stops, c.outline?.paths.length, c.outline?.circles[0]])}`;
}

export function ComponentEditRoute() {
  const { id } = useParams();
  const componentId = id === 'new' ? null : Number(id);
  const me = useMe();
  const component = useComponent(componentId);
  const remove = useDeleteComponent();
  const navigate = useNavigate();
  const canEdit = may(me.data?.role, 'editCatalog');
  // The layer rule lets the outline import flag a typed layer name as it is typed; the server checks it again.
  const convention = useConvention();
  if (componentId !== null && component.isPending) return <Page title="Component">Loading…</Page>;
  if (componentId !== null && component.error) return <Page title="Component"><ErrorText error={component.error} /></Page>;
  const c = component.data ?? null;
  return (
    <Page title={c ? `Component ${c.code}` : 'Add a component'} subtitle={c ? `${c.kind} · ${c.name}${c.usedBy ? ` · used by ${c.usedBy} template version(s)` : ''}` : undefined}
      actions={c && may(me.data?.role, 'deleteCatalog') ? (
        <Button variant="danger" disabled={remove.isPending} onClick={() => window.confirm(`Delete component ${c.code}?`) && remove.mutate(c.id, { onSuccess: () => navigate('/catalog/components') })}>Delete component</Button>
      ) : null}>
      <ErrorText error={remove.error} />
      <ComponentForm key={c ? formKey(c) : 'new'} component={c} readOnly={!canEdit} onSaved={() => navigate('/catalog/components')} />
      {c ? <ComponentOutline component={c} /> : null}
      {c && canEdit ? <OutlineImport component={c} layerRule={convention.data?.layer} /> : null}
    </Page>
  );
}
