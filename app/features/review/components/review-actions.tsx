import { useState } from 'react';
import { Link } from 'react-router-dom';
import { may, type User } from '../../../../shared/schemas/auth';
import type { TemplateVersion } from '../../../../shared/schemas/template-api';
import { transition } from '../../../../shared/review/lifecycle';
import { Button } from '../../../components/ui/button';
import { ErrorText } from '../../../components/ui/notice';
import { useReviewStep, useTrail, type ReviewStep } from '../api';
import { formatServerTime } from '../../../lib/server-time';

const STEP_WORDS: Record<string, string> = { submit: 'submitted for review', approve: 'approved', 'request-changes': 'sent back with changes requested', retire: 'retired', release: 'released' };

/**
 * The review steps this user may take on this version, worked out with the same lifecycle table
 * the server enforces, plus the trail of who did what.
 */
export function ReviewActions({ version, user, isAuthor, previous, unsavedChanges = false, onChanged, only, title = 'Review' }: {
  version: TemplateVersion; user: User; isAuthor: boolean; previous: number | null; unsavedChanges?: boolean; onChanged: () => void;
  /** The steps offered here (all by default); the comparison screen offers sign-off only. */
  only?: readonly ReviewStep[];
  title?: string;
}) {
  const [comment, setComment] = useState('');
  const step = useReviewStep(version.templateId, version.version, onChanged);
  const trail = useTrail(version.templateId, version.version);
  const can = (a: ReviewStep) => (!only || only.includes(a)) && transition(version.state, a, { role: user.role, isAuthor }).ok;
  const any = can('submit') || can('approve') || can('request-changes') || can('retire');
  return (
    <section className="flex flex-col gap-3 rounded border border-slate-300 bg-white p-4" aria-labelledby="review-title">
      <h2 id="review-title" className="text-lg font-semibold">{title}</h2>
      {previous ? <p><Link className="font-semibold text-accent-700 underline" to={`/templates/${version.templateId}/compare?from=${previous}&to=${version.version}`}>Compare v{previous} → v{version.version}</Link>: what moved, by how much, and which station offsets change.</p> : null}
      {any ? (
        <div className="flex flex-col gap-2">
          {can('approve') || can('request-changes') ? (
            <label className="flex flex-col font-semibold text-slate-700">Comment
              <textarea className="min-h-20 rounded border border-slate-400 p-2 font-normal" value={comment} onChange={(e) => setComment(e.target.value)} placeholder="What you checked, or what to change" />
            </label>
          ) : null}
          <div className="flex flex-wrap gap-2">
            {can('submit') ? <Button disabled={step.isPending || version.problems.length > 0 || unsavedChanges} onClick={() => step.mutate({ step: 'submit' })}>Submit for review</Button> : null}
            {can('submit') && unsavedChanges ? <span className="self-center text-warning-700">Save the draft first: a review sees the saved version.</span> : null}
            {can('approve') ? <Button disabled={step.isPending} onClick={() => step.mutate({ step: 'approve', comment })}>Approve and release</Button> : null}
            {can('request-changes') ? <Button variant="secondary" disabled={step.isPending || comment.trim().length < 3} onClick={() => step.mutate({ step: 'request-changes', comment })}>Request changes</Button> : null}
            {can('retire') ? <Button variant="danger" disabled={step.isPending} onClick={() => window.confirm(`Retire version ${version.version}? Jobs pinned to it keep it.`) && step.mutate({ step: 'retire' })}>Retire</Button> : null}
          </div>
        </div>
      ) : null}
      {version.state === 'in-review' && isAuthor && may(user.role, 'signOff') ? <p className="text-slate-600">You wrote this version; a reviewer other than you approves it.</p> : null}
      {version.state === 'in-review' && !may(user.role, 'signOff') ? <p className="text-slate-600">A reviewer or lead signs this version off.</p> : null}
      <ErrorText error={step.error} />
      {trail.data?.items.length ? (
        <ol className="flex flex-col gap-1 border-t border-slate-200 pt-2">
          {trail.data.items.map((r, i) => (
            <li key={i}><time dateTime={r.at} className="font-mono text-sm text-slate-600">{formatServerTime(r.at)}</time> · <span className="font-semibold">{r.by ?? 'someone'}</span> {STEP_WORDS[r.action] ?? r.action}{r.comment ? <>: <q>{r.comment}</q></> : null}</li>
          ))}
        </ol>
      ) : <p className="text-slate-600">No review steps yet.</p>}
    </section>
  );
}
