import { Link, useNavigate, useParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import type { Component } from '../../shared/schemas/catalog';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText, Notice } from '../components/ui/notice';
import { ApiError } from '../lib/api-client';
import { useState } from 'react';
import { useMe } from '../features/auth/api';
import { useComponents } from '../features/catalog/api';
import { useShopSettings } from '../features/settings/api';
import { useNewDraft, useReleaseVersion, useTemplate, useVersion } from '../features/templates/api';
import { VersionEditor } from '../features/templates/components/version-editor';
import { VersionStatusTag } from '../components/ui/version-status';
import { CornerUpLeft } from 'lucide-react';
import { STATUS_WORDS, compareBase } from '../../shared/review/lifecycle';
import { ReviewActions } from '../features/review/components/review-actions';
import { ChangesRequestedNote } from '../features/review/components/changes-requested-note';

const NO_COMPONENTS: Component[] = [];

export function TemplateVersionRoute() {
  const params = useParams();
  const id = Number(params.id);
  const n = Number(params.n);
  const me = useMe();
  const settings = useShopSettings();
  const template = useTemplate(id);
  const version = useVersion(id, n);
  const components = useComponents();
  const release = useReleaseVersion(id, n);
  const newDraft = useNewDraft(id);
  const navigate = useNavigate();
  const role = me.data?.role;
  const displayUnit = me.data?.displayUnit ?? settings.data?.defaultUnit ?? 'in';
  if (version.error || template.error) return <Page title="Template"><ErrorText error={version.error ?? template.error} /></Page>;
  if (!version.data || !template.data) return <Page title="Template">Loading…</Page>;
  const v = version.data;
  const probeTolerance = displayUnit === 'in' ? settings.data?.probeToleranceIn ?? 0.003 : settings.data?.probeToleranceMm ?? 0.08;
  return (
    <Page
      title={`${v.name} · version ${v.version}`}
      subtitle={<span className="flex flex-wrap items-center gap-2"><VersionStatusTag status={v.status} /> on plate <span className="font-mono">{v.plate.code}</span> · content hash <span className="font-mono" title={v.contentHash}>{v.contentHash.slice(0, 12)}</span></span>}
      actions={
        <>
          <nav aria-label="Versions" className="flex flex-wrap items-center gap-1">
            {template.data.versions.map((x) => (
              <Link key={x.number} to={`/templates/${id}/versions/${x.number}`} title={`v${x.number}: ${STATUS_WORDS[x.status]}`} aria-current={x.number === n ? 'page' : undefined}
                className={`inline-flex min-h-10 items-center rounded border px-3 font-mono ${x.number === n ? 'border-accent-700 bg-accent-700 text-white' : 'border-slate-400 bg-white hover:bg-slate-100'}`}>
                v{x.number}
                {x.status === 'changes-requested' ? <><CornerUpLeft aria-hidden className="ml-1 h-4 w-4" /><span className="sr-only"> (changes requested)</span></> : null}
              </Link>
            ))}
          </nav>
          {may(role, 'editTemplates') ? (
            <Button variant="secondary" disabled={newDraft.isPending} onClick={() => newDraft.mutate(n, { onSuccess: (d) => navigate(`/templates/${id}/versions/${d.version}`) })}>New draft from v{n}</Button>
          ) : null}
          {may(role, 'releaseTemplates') && (v.state === 'draft' || v.state === 'in-review') ? (
            <Button disabled={release.isPending || v.problems.length > 0} onClick={() => window.confirm(`Release version ${n}? Released versions never change.`) && release.mutate(undefined)}>Release v{n}</Button>
          ) : null}
        </>
      }
    >
      {release.error instanceof ApiError && release.error.code === 'naming' ? (
        <NamingWaiver problems={(release.error.details as { naming: { message: string }[] }).naming} pending={release.isPending} onWaive={(w) => release.mutate(w)} />
      ) : <ErrorText error={release.error ?? newDraft.error} />}
      {v.changesRequested ? <ChangesRequestedNote changes={v.changesRequested} version={v.version} /> : null}
      {v.namingWaiver ? <Notice tone="caution" title="Released with a naming waiver">{v.namingWaiver}</Notice> : null}
      <VersionEditor key={`${id}-${n}-${v.revision}`} templateId={id} version={v} catalog={components.data?.items ?? NO_COMPONENTS} displayUnit={displayUnit} canEdit={may(role, 'editTemplates')} probeTolerance={probeTolerance}
        reviewSlot={({ dirty }) => (me.data ? (
          <ReviewActions version={v} user={me.data} isAuthor={v.authorId === me.data.id} unsavedChanges={dirty}
            previous={compareBase(template.data.versions, n)}
            onChanged={() => { void template.refetch(); void version.refetch(); }} />
        ) : null)} />
    </Page>
  );
}

/** A lead may release despite naming problems, with a written reason that stays with the version. */
function NamingWaiver({ problems, pending, onWaive }: { problems: { message: string }[]; pending: boolean; onWaive: (waiver: string) => void }) {
  const [text, setText] = useState('');
  return (
    <Notice tone="warning" title="This version breaks the naming convention">
      <ul className="list-disc pl-5">{problems.slice(0, 10).map((p, i) => <li key={i}>{p.message}</li>)}</ul>
      <label className="mt-2 flex flex-col font-semibold">Release anyway, because (at least 10 characters; kept with the version)
        <textarea className="min-h-20 rounded border border-slate-400 p-2 font-normal" value={text} onChange={(e) => setText(e.target.value)} />
      </label>
      <Button className="mt-2" variant="danger" disabled={pending || text.trim().length < 10} onClick={() => onWaive(text.trim())}>Release with this waiver</Button>
    </Notice>
  );
}
