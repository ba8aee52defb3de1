import { useMemo } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { evaluateTemplate } from '../../shared/stations/evaluate-template';
import { STATUS_WORDS } from '../../shared/review/lifecycle';
import type { TemplateVersion } from '../../shared/schemas/template-api';
import { Page } from '../components/ui/page';
import { inputClass } from '../components/ui/field';
import { ErrorText, Notice } from '../components/ui/notice';
import { VersionStatusTag } from '../components/ui/version-status';
import { useMe } from '../features/auth/api';
import { useShopSettings } from '../features/settings/api';
import { useTemplate, useVersion } from '../features/templates/api';
import { PlateDrawing } from '../features/templates/components/plate-drawing';
import { useDiff } from '../features/review/api';
import { ChangeTables } from '../features/review/components/change-tables';
import { ReviewActions } from '../features/review/components/review-actions';
import { ChangesRequestedNote } from '../features/review/components/changes-requested-note';

const layoutOf = (v: TemplateVersion) => ({ name: v.name, unit: v.unit, plate: v.plate, components: v.components, placements: v.placements, sharedOffset: v.sharedOffset, numbering: v.numbering });
const SIGN_OFF = ['approve', 'request-changes'] as const;

/** "What changed?" between any two versions, at a shareable address: ?from=a&to=b; the newer one is signed off here. */
export function TemplateCompareRoute() {
  const id = Number(useParams().id);
  const [search, setSearch] = useSearchParams();
  const template = useTemplate(id);
  const me = useMe();
  const settings = useShopSettings();
  const versions = template.data?.versions ?? [];
  const numbers = versions.map((v) => v.number);
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
  const refresh = () => { void template.refetch(); void newer.refetch(); void older.refetch(); };
  const v = newer.data;
  return (
    <Page title={`${template.data?.name ?? 'Template'} · compare versions`} subtitle={diff.data?.summary}
      actions={
        <div className="flex flex-wrap items-end gap-2">
          {(['from', 'to'] as const).map((k) => (
            <label key={k} className="flex flex-col text-sm font-semibold text-slate-700">{k === 'from' ? 'Older' : 'Newer'}
              <select className={`${inputClass} w-56 max-w-full`} value={k === 'from' ? from : to} onChange={(e) => pick(k, e.target.value)}>
                {versions.map((x) => <option key={x.number} value={x.number}>v{x.number} · {STATUS_WORDS[x.status]}</option>)}
              </select>
            </label>
          ))}
          <Link className="inline-flex min-h-10 items-center rounded border border-slate-400 bg-white px-3 font-semibold hover:bg-slate-100" to={`/templates/${id}/versions/${to}`}>Open v{to}</Link>
        </div>
      }>
      <ErrorText error={template.error ?? older.error ?? newer.error ?? diff.error} />
      {older.data && v ? (
        <p className="flex flex-wrap items-center gap-2" aria-label="Versions compared">
          <span className="font-semibold">v{from}</span><VersionStatusTag status={older.data.status} />
          <span aria-hidden>→</span><span className="sr-only">to</span>
          <span className="font-semibold">v{to}</span><VersionStatusTag status={v.status} />
        </p>
      ) : null}
      {v?.changesRequested ? <ChangesRequestedNote changes={v.changesRequested} version={v.version} /> : null}
      {from === to ? <Notice tone="info" title="Choose two different versions to compare." /> : null}
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        {drawing ? (
          <div className="min-w-0 rounded border border-slate-300 bg-white">
            <PlateDrawing content={drawing.b} stations={drawing.eb.stations} origin={drawing.eb.origin} displayUnit={displayUnit}
              overlay={{ content: drawing.a, stations: drawing.ea.stations, origin: drawing.ea.origin, label: `version ${from}` }} label={`version ${to}`} height="30rem" />
          </div>
        ) : <p>Loading…</p>}
        {v && me.data && from !== to ? (
          <ReviewActions version={v} user={me.data} isAuthor={v.authorId === me.data.id} previous={null} only={SIGN_OFF} title={`Sign off v${to}`} onChanged={refresh} />
        ) : null}
      </div>
      {diff.data ? <ChangeTables diff={diff.data} displayUnit={displayUnit} /> : null}
    </Page>
  );
}
