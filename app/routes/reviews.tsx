import { Link } from 'react-router-dom';
import { Page } from '../components/ui/page';
import { ErrorText } from '../components/ui/notice';
import { VersionStatusTag } from '../components/ui/version-status';
import { useTemplates } from '../features/templates/api';
import { compareBase } from '../../shared/review/lifecycle';
import { formatServerTime } from '../lib/server-time';

/** "What is waiting for me?": every version in review, with the comparison it should be read against. */
export function ReviewsRoute() {
  const templates = useTemplates();
  const rows = (templates.data?.items ?? []).flatMap((t) => t.versions.map((v) => ({ t, v, before: compareBase(t.versions, v.number) })));
  const waiting = rows.filter((r) => r.v.status === 'in-review');
  const sentBack = rows.filter((r) => r.v.status === 'changes-requested');
  const drafts = rows.filter((r) => r.v.status === 'draft');
  const link = 'font-semibold text-accent-700 underline';
  return (
    <Page title="Reviews" subtitle="Template versions waiting for someone other than their author to compare and sign off.">
      <ErrorText error={templates.error} />
      <section aria-labelledby="waiting-title" className="flex flex-col gap-2">
        <h2 id="waiting-title" className="text-lg font-semibold">In review ({waiting.length})</h2>
        {waiting.length ? (
          <ul className="flex flex-col gap-2">
            {waiting.map(({ t, v, before }) => (
              <li key={`${t.id}-${v.number}`} className="flex flex-wrap items-center gap-3 rounded border border-slate-300 bg-white p-3">
                <VersionStatusTag status={v.status} />
                <span className="font-semibold">{t.name} v{v.number}</span>
                <span className="text-slate-600">on {t.plateCode} · {v.placements} placements · saved <time dateTime={v.updatedAt}>{formatServerTime(v.updatedAt)}</time></span>
                <span className="ml-auto flex flex-wrap gap-3">
                  {before ? <Link className={link} to={`/templates/${t.id}/compare?from=${before}&to=${v.number}`}>Compare v{before} → v{v.number}</Link> : null}
                  <Link className={link} to={`/templates/${t.id}/versions/${v.number}`}>Open v{v.number}</Link>
                </span>
              </li>
            ))}
          </ul>
        ) : <p className="text-slate-600">Nothing is waiting for review.</p>}
      </section>
      <section aria-labelledby="sent-back-title" className="flex flex-col gap-2">
        <h2 id="sent-back-title" className="text-lg font-semibold">Sent back with changes requested ({sentBack.length})</h2>
        {sentBack.length ? (
          <ul className="flex flex-col gap-2">
            {sentBack.map(({ t, v }) => (
              <li key={`${t.id}-${v.number}`} className="flex flex-col gap-1 rounded border border-slate-300 bg-white p-3">
                <span className="flex flex-wrap items-center gap-3">
                  <VersionStatusTag status={v.status} />
                  <Link className={link} to={`/templates/${t.id}/versions/${v.number}`}>{t.name} v{v.number}</Link>
                  {v.changesRequested ? <span className="text-slate-600">by {v.changesRequested.by ?? 'a reviewer'} · <time dateTime={v.changesRequested.at}>{formatServerTime(v.changesRequested.at)}</time></span> : null}
                </span>
                {v.changesRequested ? <q className="break-words">{v.changesRequested.comment}</q> : null}
              </li>
            ))}
          </ul>
        ) : <p className="text-slate-600">No version is waiting on its author.</p>}
      </section>
      <section aria-labelledby="drafts-title" className="flex flex-col gap-2">
        <h2 id="drafts-title" className="text-lg font-semibold">Drafts not yet submitted ({drafts.length})</h2>
        <ul className="flex flex-col gap-1">
          {drafts.map(({ t, v }) => <li key={`${t.id}-${v.number}`} className="flex flex-wrap items-center gap-2"><VersionStatusTag status={v.status} /><Link className={link} to={`/templates/${t.id}/versions/${v.number}`}>{t.name} v{v.number}</Link> <span className="text-slate-600">· saved <time dateTime={v.updatedAt}>{formatServerTime(v.updatedAt)}</time></span></li>)}
        </ul>
      </section>
    </Page>
  );
}
