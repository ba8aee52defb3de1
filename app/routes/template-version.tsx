import { Link, useNavigate, useParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import type { Component } from '../../shared/schemas/catalog';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useComponents } from '../features/catalog/api';
import { useShopSettings } from '../features/settings/api';
import { useNewDraft, useReleaseVersion, useTemplate, useVersion } from '../features/templates/api';
import { VersionEditor } from '../features/templates/components/version-editor';
import { StateTag } from './templates';

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
      subtitle={<span className="flex flex-wrap items-center gap-2"><StateTag state={v.state} /> on plate <span className="font-mono">{v.plate.code}</span> · content hash <span className="font-mono" title={v.contentHash}>{v.contentHash.slice(0, 12)}</span></span>}
      actions={
        <>
          <nav aria-label="Versions" className="flex flex-wrap items-center gap-1">
            {template.data.versions.map((x) => (
              <Link key={x.number} to={`/templates/${id}/versions/${x.number}`} aria-current={x.number === n ? 'page' : undefined}
                className={`inline-flex min-h-10 items-center rounded border px-3 font-mono ${x.number === n ? 'border-accent-700 bg-accent-700 text-white' : 'border-slate-400 bg-white hover:bg-slate-100'}`}>
                v{x.number}
              </Link>
            ))}
          </nav>
          {may(role, 'editTemplates') ? (
            <Button variant="secondary" disabled={newDraft.isPending} onClick={() => newDraft.mutate(n, { onSuccess: (d) => navigate(`/templates/${id}/versions/${d.version}`) })}>New draft from v{n}</Button>
          ) : null}
          {may(role, 'releaseTemplates') && (v.state === 'draft' || v.state === 'in-review') ? (
            <Button disabled={release.isPending || v.problems.length > 0} onClick={() => window.confirm(`Release version ${n}? Released versions never change.`) && release.mutate()}>Release v{n}</Button>
          ) : null}
        </>
      }
    >
      <ErrorText error={release.error ?? newDraft.error} />
      <VersionEditor key={`${id}-${n}-${v.revision}`} templateId={id} version={v} catalog={components.data?.items ?? NO_COMPONENTS} displayUnit={displayUnit} canEdit={may(role, 'editTemplates')} probeTolerance={probeTolerance} />
    </Page>
  );
}
