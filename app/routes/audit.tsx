import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { AuditEntry } from '../../shared/schemas/audit';
import { Page } from '../components/ui/page';
import { TextField } from '../components/ui/field';
import { DataTable, columnHelperFor } from '../components/ui/data-table';
import { ErrorText } from '../components/ui/notice';
import { useAudit } from '../features/review/api';
import { formatServerTime } from '../lib/server-time';

const col = columnHelperFor<AuditEntry>();
const columns = col.columns([
  col.accessor('at', { header: 'When', cell: (c) => <time dateTime={c.getValue()} className="font-mono text-sm">{formatServerTime(c.getValue(), { seconds: true })}</time> }),
  col.accessor('userEmail', { header: 'Who', cell: (c) => c.getValue() ?? '—' }),
  col.accessor('action', { header: 'What', cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
  col.accessor((e) => `${e.objectType} ${e.objectId}`, { id: 'object', header: 'Object' }),
  col.accessor('summary', { header: 'Summary' }),
]);
const NONE: AuditEntry[] = [];

/** Every write, newest first; filter by object and by day. */
export function AuditRoute() {
  // The home's audit lines link here filtered by their object type.
  const [search] = useSearchParams();
  const [object, setObject] = useState(search.get('object') ?? '');
  const [from, setFrom] = useState('');
  const [to, setTo] = useState('');
  const [text, setText] = useState('');
  const q = new URLSearchParams();
  if (object) q.set('object', object);
  if (from) q.set('from', from);
  if (to) q.set('to', to);
  const audit = useAudit(q.toString());
  return (
    <Page title="Audit trail" subtitle="Who changed what, and when.">
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-col text-sm font-semibold text-slate-700">Object
          <select className="min-h-10 rounded border border-slate-400 bg-white px-3" value={object} onChange={(e) => setObject(e.target.value)}>
            <option value="">all</option>
            {[...new Set(['template', 'template-version', 'component', 'plate', 'job', 'user', 'naming', 'settings', ...(object ? [object] : [])])].map((o) => <option key={o} value={o}>{o}</option>)}
          </select>
        </label>
        <TextField label="From day" type="date" value={from} onChange={(e) => setFrom(e.target.value)} />
        <TextField label="To day" type="date" value={to} onChange={(e) => setTo(e.target.value)} />
        <TextField label="Filter by user or words" value={text} onChange={(e) => setText(e.target.value)} />
      </div>
      <ErrorText error={audit.error} />
      <p className="text-slate-700">{audit.data ? `${audit.data.total} entries${audit.data.total > audit.data.items.length ? `, newest ${audit.data.items.length} shown` : ''}` : 'Loading…'}</p>
      <DataTable caption="Audit trail" columns={columns} data={audit.data?.items ?? NONE} filter={text} getRowId={(e) => String(e.id)} empty="Nothing recorded for this filter." />
    </Page>
  );
}
