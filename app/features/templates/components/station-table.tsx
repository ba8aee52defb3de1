import { useMemo, useState } from 'react';
import { Copy } from 'lucide-react';
import type { Unit } from '../../../../shared/schemas/common';
import type { Station } from '../../../../shared/schemas/template';
import { convert, formatLength, formatNumber } from '../../../../shared/units/units';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';
import { Button } from '../../../components/ui/button';

interface Row { number: number; id: string; placement: string; stop: number; x: number; y: number; z: number; c: number; nominalWidth: number | null; unit: Unit }

const col = columnHelperFor<Row>();
const len = (c: { getValue: () => number; row: { original: Row } }) => formatLength(c.getValue(), c.row.original.unit);
const columns = col.columns([
  col.accessor('number', { header: 'Station', meta: { numeric: true } }),
  col.accessor('x', { header: 'X', meta: { numeric: true }, cell: len }),
  col.accessor('y', { header: 'Y', meta: { numeric: true }, cell: len }),
  col.accessor('z', { header: 'Z', meta: { numeric: true }, cell: len }),
  col.accessor('c', { header: 'C', meta: { numeric: true }, cell: (c) => `${formatNumber(c.getValue(), 'mm')}°` }),
  col.accessor('nominalWidth', { header: 'Width held', meta: { numeric: true }, cell: (c) => (c.getValue() === null ? '—' : formatLength(c.getValue()!, c.row.original.unit)) }),
  col.accessor('placement', { header: 'Placement', cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
  col.accessor('stop', { header: 'Stop', meta: { numeric: true }, cell: (c) => c.getValue() + 1 }),
]);

/** Station translations from the shared offset, shown in the display unit. */
export function StationTable({ stations, unit, displayUnit }: { stations: Station[]; unit: Unit; displayUnit: Unit }) {
  const [copied, setCopied] = useState(false);
  const rows = useMemo<Row[]>(() => stations.map((s) => ({
    number: s.number, id: s.id, placement: s.placement, stop: s.stop, c: s.c, unit: displayUnit,
    x: convert(s.x, unit, displayUnit), y: convert(s.y, unit, displayUnit), z: convert(s.z, unit, displayUnit),
    nominalWidth: s.nominalWidth === null ? null : convert(s.nominalWidth, unit, displayUnit),
  })), [stations, unit, displayUnit]);
  const copy = async () => {
    const text = [`station\tx (${displayUnit})\ty (${displayUnit})\tz (${displayUnit})\tc (deg)`,
      ...rows.map((r) => [r.number, formatNumber(r.x, displayUnit), formatNumber(r.y, displayUnit), formatNumber(r.z, displayUnit), formatNumber(r.c, 'mm')].join('\t'))].join('\n');
    await navigator.clipboard.writeText(text);
    setCopied(true);
    setTimeout(() => setCopied(false), 2000);
  };
  return (
    <section className="flex flex-col gap-2" aria-labelledby="station-table-title">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="station-table-title" className="text-lg font-semibold">Stations <span className="font-normal text-slate-600">— translation from the shared offset, {rows.length} in all; Z0 is the shared offset's Z0, Z the part seat</span></h2>
        <Button variant="secondary" onClick={copy}><Copy aria-hidden className="h-4 w-4" />{copied ? 'Copied' : 'Copy table'}</Button>
      </div>
      <DataTable caption="Station translations" columns={columns} data={rows} getRowId={(r) => r.id} empty="No stations yet: add a rail with stops in use." />
    </section>
  );
}
