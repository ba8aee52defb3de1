import { useNavigate, useParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useComponent, useDeleteComponent } from '../features/catalog/api';
import { ComponentForm } from '../features/catalog/components/component-form';

export function ComponentEditRoute() {
  const { id } = useParams();
  const componentId = id === 'new' ? null : Number(id);
  const me = useMe();
  const component = useComponent(componentId);
  const remove = useDeleteComponent();
  const navigate = useNavigate();
  const canEdit = may(me.data?.role, 'editCatalog');
  if (componentId !== null && component.isPending) return <Page title="Component">Loading…</Page>;
  if (componentId !== null && component.error) return <Page title="Component"><ErrorText error={component.error} /></Page>;
  const c = component.data ?? null;
  return (
    <Page title={c ? `Component ${c.code}` : 'Add a component'} subtitle={c ? `${c.kind} · ${c.name}${c.usedBy ? ` · used by ${c.usedBy} template version(s)` : ''}` : undefined}
      actions={c && may(me.data?.role, 'deleteCatalog') ? (
        <Button variant="danger" disabled={remove.isPending} onClick={() => window.confirm(`Delete component ${c.code}?`) && remove.mutate(c.id, { onSuccess: () => navigate('/catalog/components') })}>Delete component</Button>
      ) : null}>
      <ErrorText error={remove.error} />
      <ComponentForm key={c?.id ?? 'new'} component={c} readOnly={!canEdit} onSaved={() => navigate('/catalog/components')} />
    </Page>
  );
}
