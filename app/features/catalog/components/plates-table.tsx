import { Link } from 'react-router-dom';
import type { Plate } from '../../../../shared/schemas/catalog';
import { formatLength } from '../../../../shared/units/units';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';

const col = columnHelperFor<Plate>();
const columns = col.columns([
  col.accessor('code', { header: 'Code', cell: (c) => <Link className="font-mono font-semibold text-accent-700 underline" to={`/catalog/plates/${c.row.original.id}`}>{c.getValue()}</Link> }),
  col.accessor('name', { header: 'Name' }),
  col.accessor('unit', { header: 'Unit' }),
  col.accessor('pitch', { header: 'Pitch', meta: { numeric: true }, cell: (c) => formatLength(c.getValue(), c.row.original.unit) }),
  col.accessor((p) => `${p.columns} × ${p.rows}`, { id: 'grid', header: 'Holes (cols × rows)', meta: { numeric: true } }),
  col.accessor('holeDiameter', { header: 'Hole ⌀', meta: { numeric: true }, cell: (c) => formatLength(c.getValue(), c.row.original.unit) }),
  col.accessor('thread', { header: 'Thread' }),
  col.accessor('usedBy', { header: 'Templates', meta: { numeric: true } }),
]);

export function PlatesTable({ plates, filter }: { plates: Plate[]; filter: string }) {
  return <DataTable caption="Plates in the catalog" columns={columns} data={plates} filter={filter} getRowId={(p) => String(p.id)} empty="No plates match." />;
}
