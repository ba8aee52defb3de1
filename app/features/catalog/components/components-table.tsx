import { Link } from 'react-router-dom';
import type { Component } from '../../../../shared/schemas/catalog';
import { formatLength } from '../../../../shared/units/units';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';

const col = columnHelperFor<Component>();
const columns = col.columns([
  col.accessor('code', { header: 'Code', cell: (c) => <Link className="font-mono font-semibold text-accent-700 underline" to={`/catalog/components/${c.row.original.id}`}>{c.getValue()}</Link> }),
  col.accessor('kind', { header: 'Kind' }),
  col.accessor('name', { header: 'Name' }),
  col.accessor('unit', { header: 'Unit' }),
  col.accessor((c) => c.dowels.length, { id: 'dowels', header: 'Dowels', meta: { numeric: true } }),
  col.accessor((c) => c.stops.length, { id: 'stops', header: 'Stops', meta: { numeric: true } }),
  col.accessor((c) => (c.dowels.length > 1 ? Math.hypot(c.dowels[c.dowels.length - 1]!.x, c.dowels[c.dowels.length - 1]!.y) : 0), {
    id: 'span', header: 'Dowel span', meta: { numeric: true }, cell: (c) => (c.getValue() ? formatLength(c.getValue(), c.row.original.unit) : '—'),
  }),
  col.accessor((c) => (c.clamp ? 'yes' : 'no'), { id: 'clamp', header: 'Clamp model' }),
  col.accessor('layer', { header: 'Layer', cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
  col.accessor('usedBy', { header: 'Used by', meta: { numeric: true } }),
]);

export function ComponentsTable({ components, filter }: { components: Component[]; filter: string }) {
  return <DataTable caption="Components in the catalog" columns={columns} data={components} filter={filter} getRowId={(c) => String(c.id)} empty="No components match." />;
}
