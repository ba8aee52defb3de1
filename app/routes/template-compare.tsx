import { useMemo } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { Page } from '../components/ui/page';
import { inputClass } from '../components/ui/field';
import { ErrorText, Notice } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useShopSettings } from '../features/settings/api';
import { useTemplate, useVersion } from '../features/templates/api';
import { PlateDrawing } from '../features/templates/components/plate-drawing';
import { useDiff } from '../features/review/api';
import { ChangeTables } from '../features/review/components/change-tables';

const layoutOf = (v: TemplateVersion) => ({ name: v.name, unit: v.unit, plate: v.plate, components: v.components, placements: v.placements, sharedOffset: v.sharedOffset, numbering: v.numbering });

/** "What changed?" between any two versions, at a shareable address: ?from=a&to=b. */
export function TemplateCompareRoute() {
  const id = Number(useParams().id);
  const [search, setSearch] = useSearchParams();
  const template = useTemplate(id);
  const me = useMe();
  const settings = useShopSettings();
  const numbers = template.data?.versions.map((v) => v.number) ?? [];
  const to = Number(search.get('to')) || numbers.at(-1) || 1;
  const from = Number(search.get('from')) || numbers.filter((n) => n < to).at(-1) || to;
  const older = useVersion(id, from);
  const newer = useVersion(id, to);
  const diff = useDiff(id, from, to);
  const displayUnit = me.data?.displayUnit ?? settings.data?.defaultUnit ?? 'in';
  const drawing = useMemo(() => {
    if (!older.data || !newer.data) return null;
    const a = layoutOf(older.data);
    const b = layoutOf(newer.data);
    const ea = evaluateTemplate(a);
    const eb = evaluateTemplate(b);
    return { a, b, ea, eb };
  }, [older.data, newer.data]);
  const pick = (key: 'from' | 'to', value: string) => setSearch((s) => { const next = new URLSearchParams(s); next.set(key, value); if (key === 'to' && !next.get('from')) next.set('from', String(from)); return next; });
  return (
    <Page title={`${template.data?.name ?? 'Template'} · compare versions`} subtitle={diff.data?.summary}
      actions={
        <div className="flex items-end gap-2">
          {(['from', 'to'] as const).map((k) => (
            <label key={k} className="flex flex-col text-sm font-semibold text-slate-700">{k === 'from' ? 'Older' : 'Newer'}
              <select className={`${inputClass} w-28`} value={k === 'from' ? from : to} onChange={(e) => pick(k, e.target.value)}>
                {numbers.map((n) => <option key={n} value={n}>v{n}</option>)}
              </select>
            </label>
          ))}
          <Link className="inline-flex min-h-10 items-center rounded border border-slate-400 bg-white px-3 font-semibold hover:bg-slate-100" to={`/templates/${id}/versions/${to}`}>Open v{to}</Link>
        </div>
      }>
      <ErrorText error={template.error ?? older.error ?? newer.error ?? diff.error} />
      {from === to ? <Notice tone="info" title="Choose two different versions to compare." /> : null}
      {drawing ? (
        <div className="rounded border border-slate-300 bg-white">
          <PlateDrawing content={drawing.b} stations={drawing.eb.stations} origin={drawing.eb.origin} displayUnit={displayUnit}
            overlay={{ content: drawing.a, stations: drawing.ea.stations, origin: drawing.ea.origin, label: `version ${from}` }} label={`version ${to}`} height="30rem" />
        </div>
      ) : <p>Loading…</p>}
      {diff.data ? <ChangeTables diff={diff.data} displayUnit={displayUnit} /> : null}
    </Page>
  );
}
