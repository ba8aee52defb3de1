import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { ArrowRight, Briefcase, ClipboardCheck, CornerUpLeft, FileClock, Hourglass, PencilLine, ScrollText, type LucideIcon } from 'lucide-react';
import type { Home, HomeAuditLine, HomeDraft, HomeJob, HomeReview } from '../../../../shared/schemas/home';
import { VersionStatusTag } from '../../../components/ui/version-status';
import { formatServerTime } from '../../../lib/server-time';

const link = 'font-semibold text-accent-700 underline break-words';

/** One list of the home: a heading with its count, each line a link, or a sentence saying nothing waits. */
function Section({ id, title, Icon, count, empty, children }: { id: string; title: string; Icon: LucideIcon; count: number; empty: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex min-w-0 flex-col gap-2 rounded border border-slate-300 bg-white p-4">
      <h2 id={id} className="flex items-center gap-2 text-lg font-semibold"><Icon aria-hidden className="h-5 w-5 shrink-0" />{title} <span className="num text-slate-600">({count})</span></h2>
      {count ? <ul className="flex flex-col divide-y divide-slate-200">{children}</ul> : <p className="text-slate-600">{empty}</p>}
    </section>
  );
}

const reviewHref = (r: { templateId: number; version: number; compareFrom: number | null }) =>
  r.compareFrom ? `/templates/${r.templateId}/compare?from=${r.compareFrom}&to=${r.version}` : `/templates/${r.templateId}/versions/${r.version}`;

function ReviewLine({ r }: { r: HomeReview }) {
  return (
    <li className="flex flex-col gap-1 py-2">
      <Link className={link} to={reviewHref(r)}>
        {r.compareFrom ? `Compare ${r.templateName} v${r.compareFrom} → v${r.version}` : `Open ${r.templateName} v${r.version} (first version)`}
      </Link>
      <span className="flex flex-wrap items-center gap-2 text-slate-600">
        <VersionStatusTag status="in-review" />
        <span>sent by {r.submittedBy ?? 'someone'}{r.submittedAt ? <> · <time dateTime={r.submittedAt}>{formatServerTime(r.submittedAt)}</time></> : null} · {r.placements} placements on <span className="font-mono">{r.plateCode}</span></span>
      </span>
    </li>
  );
}

function DraftLine({ d }: { d: HomeDraft }) {
  return (
    <li className="flex flex-col gap-1 py-2">
      <span className="flex flex-wrap items-center gap-2">
        <VersionStatusTag status={d.status} />
        <Link className={link} to={`/templates/${d.templateId}/versions/${d.version}`}>{d.templateName} v{d.version}</Link>
      </span>
      {d.changesRequested ? (
        <span className="flex flex-col gap-0.5 border-l-4 border-slate-800 pl-3">
          <span className="text-slate-700">{d.changesRequested.by ?? 'A reviewer'} asked for changes · <time dateTime={d.changesRequested.at}>{formatServerTime(d.changesRequested.at)}</time></span>
          <q className="break-words">{d.changesRequested.comment}</q>
        </span>
      ) : <span className="text-slate-600">saved <time dateTime={d.updatedAt}>{formatServerTime(d.updatedAt)}</time>; submit it for review when it is ready</span>}
    </li>
  );
}

function JobLine({ j, behind }: { j: HomeJob; behind: boolean }) {
  return (
    <li className="flex flex-col gap-1 py-2">
      <Link className={link} to={`/jobs/${j.id}`}>{j.name}</Link>
      <span className="flex flex-wrap items-center gap-x-3 text-slate-600">
        <span>part <span className="font-mono">{j.partNumber}</span> on {j.templateName} v{j.version}</span>
        {behind && j.newerRelease ? (
          <Link className={`${link} inline-flex items-center gap-1`} to={`/templates/${j.templateId}/compare?from=${j.version}&to=${j.newerRelease}`}>
            v{j.newerRelease} is released: compare <ArrowRight aria-hidden className="h-4 w-4" />
          </Link>
        ) : null}
        {!behind ? <span>no stock check yet</span> : null}
      </span>
    </li>
  );
}

/** Where an audit line's object lives: its own page when it has one, else the audit trail filtered to its kind. */
function auditHref(a: HomeAuditLine): string {
  const id = encodeURIComponent(a.objectId);
  const version = /^(\d+)\/(\d+)$/.exec(a.objectId);
  if (a.objectType === 'template-version' && version) return `/templates/${version[1]}/versions/${version[2]}`;
  if (/^\d+$/.test(a.objectId)) {
    if (a.objectType === 'job') return `/jobs/${id}`;
    if (a.objectType === 'component') return `/catalog/components/${id}`;
    if (a.objectType === 'plate') return `/catalog/plates/${id}`;
    if (a.objectType === 'template') return `/templates/${id}/versions/1`;
  }
  if (a.objectType === 'naming') return '/naming';
  return `/audit?object=${encodeURIComponent(a.objectType)}`;
}

/** The signed-in person's home: only the lists their role gets, each line a link to where the work is. */
export function HomeLists({ home }: { home: Home }) {
  return (
    <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
      {home.reviews ? (
        <Section id="home-reviews" title="Waiting for your review" Icon={Hourglass} count={home.reviews.length} empty="No version is waiting for your review.">
          {home.reviews.map((r) => <ReviewLine key={`${r.templateId}-${r.version}`} r={r} />)}
        </Section>
      ) : null}
      {home.drafts ? (
        <Section id="home-drafts" title="Your drafts" Icon={home.drafts.some((d) => d.changesRequested) ? CornerUpLeft : PencilLine} count={home.drafts.length} empty="You have no draft open.">
          {home.drafts.map((d) => <DraftLine key={`${d.templateId}-${d.version}`} d={d} />)}
        </Section>
      ) : null}
      {home.jobsBehind ? (
        <Section id="home-jobs-behind" title="Jobs pinned to an older release" Icon={Briefcase} count={home.jobsBehind.length} empty="Every job runs on its template's latest release.">
          {home.jobsBehind.map((j) => <JobLine key={j.id} j={j} behind />)}
        </Section>
      ) : null}
      {home.jobsUnchecked ? (
        <Section id="home-jobs-unchecked" title="Jobs with no stock check yet" Icon={ClipboardCheck} count={home.jobsUnchecked.length} empty="Every job has a stock check.">
          {home.jobsUnchecked.map((j) => <JobLine key={j.id} j={j} behind={false} />)}
        </Section>
      ) : null}
      {home.audit ? (
        <Section id="home-audit" title="Recent changes" Icon={ScrollText} count={home.audit.length} empty="Nothing has been written yet.">
          {home.audit.map((a) => (
            <li key={a.id} className="flex flex-col gap-0.5 py-2">
              <Link className={link} to={auditHref(a)}>{a.summary}</Link>
              <span className="flex flex-wrap items-center gap-2 text-sm text-slate-600"><FileClock aria-hidden className="h-4 w-4" /><time dateTime={a.at}>{formatServerTime(a.at)}</time> · {a.userEmail ?? 'system'} · <span className="font-mono">{a.action}</span></span>
            </li>
          ))}
        </Section>
      ) : null}
    </div>
  );
}
