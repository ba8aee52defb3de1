import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import type { JobSummary } from '../../shared/schemas/job';
import type { TemplateSummary } from '../../shared/schemas/template-api';
import { Page } from '../components/ui/page';
import { TextField } from '../components/ui/field';
import { ErrorText } from '../components/ui/notice';
import { applyServerIssues } from '../lib/form-errors';
import { useMe } from '../features/auth/api';
import { useCreateJob, useJobs } from '../features/jobs/api';
import { JobForm } from '../features/jobs/components/job-form';
import { JobsTable } from '../features/jobs/components/jobs-table';
import { useTemplates } from '../features/templates/api';

const NO_JOBS: JobSummary[] = [];
const NO_TEMPLATES: TemplateSummary[] = [];

/** Every job, and for programmers and leads a new one pinned to a released template version. */
export function JobsRoute() {
  const me = useMe();
  const jobs = useJobs();
  const [filter, setFilter] = useState('');
  const canEdit = may(me.data?.role, 'editJobs');
  return (
    <Page title="Jobs" subtitle="One part run on one released template version: its stations, its bars and its job package.">
      <div className="max-w-sm"><TextField label="Filter jobs" value={filter} onChange={(e) => setFilter(e.target.value)} /></div>
      <ErrorText error={jobs.error} />
      {jobs.isPending ? <p className="text-slate-700">Loading jobs…</p> : <JobsTable jobs={jobs.data?.items ?? NO_JOBS} filter={filter} />}
      {canEdit ? <NewJob /> : null}
    </Page>
  );
}

function NewJob() {
  const templates = useTemplates();
  const create = useCreateJob();
  const navigate = useNavigate();
  if (templates.error) return <ErrorText error={templates.error} />;
  // The selects are uncontrolled: they are drawn once their options are known, so what shows is what is sent.
  if (templates.isPending) return <p className="text-slate-700">Loading templates…</p>;
  return (
    <JobForm
      title="New job"
      submitLabel="Create job"
      templates={templates.data?.items ?? NO_TEMPLATES}
      pending={create.isPending}
      error={create.error}
      onSubmit={(values, setError) => create.mutate(values, { onSuccess: (job) => navigate(`/jobs/${job.id}`), onError: (err) => applyServerIssues(err, setError) })}
    />
  );
}
