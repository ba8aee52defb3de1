import { useNavigate, useParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useDeletePlate, usePlate } from '../features/catalog/api';
import { PlateForm } from '../features/catalog/components/plate-form';

export function PlateEditRoute() {
  const { id } = useParams();
  const plateId = id === 'new' ? null : Number(id);
  const me = useMe();
  const plate = usePlate(plateId);
  const remove = useDeletePlate();
  const navigate = useNavigate();
  const canEdit = may(me.data?.role, 'editCatalog');
  if (plateId !== null && plate.isPending) return <Page title="Plate">Loading…</Page>;
  if (plateId !== null && plate.error) return <Page title="Plate"><ErrorText error={plate.error} /></Page>;
  const p = plate.data ?? null;
  return (
    <Page title={p ? `Plate ${p.code}` : 'Add a plate'} subtitle={p && p.usedBy ? `Used by ${p.usedBy} template(s).` : undefined}
      actions={p && may(me.data?.role, 'deleteCatalog') ? (
        <Button variant="danger" disabled={remove.isPending} onClick={() => window.confirm(`Delete plate ${p.code}?`) && remove.mutate(p.id, { onSuccess: () => navigate('/catalog/plates') })}>Delete plate</Button>
      ) : null}>
      <ErrorText error={remove.error} />
      <PlateForm key={p?.id ?? 'new'} plate={p} readOnly={!canEdit} onSaved={() => navigate('/catalog/plates')} />
    </Page>
  );
}
