import { useSearchParams } from 'react-router-dom';
import { may } from '../../shared/schemas/auth';
import { Page } from '../components/ui/page';
import { SelectField } from '../components/ui/field';
import { ErrorText, Notice } from '../components/ui/notice';
import { useMe } from '../features/auth/api';
import { useComponents } from '../features/catalog/api';
import { useJob, useJobs } from '../features/jobs/api';
import { JobBarEntry } from '../features/stock-check/components/job-bar-entry';
import { StockCheckScreen } from '../features/stock-check/components/stock-check-screen';

/**
 * The operator's question at the machine: which bars go on which setting? For a job (?job=ID) the
 * bars are checked against the job's rails and kept as a draft while typed; without one, against a
 * rail chosen from the catalog.
 */
export function StockCheckRoute() {
  const [params, setParams] = useSearchParams();
  const jobId = Number(params.get('job')) || null;
  const jobs = useJobs();
  const options = [
    { value: '', label: 'No job: a jaw rail from the catalog' },
    ...(jobs.data?.items ?? []).map((j) => ({ value: String(j.id), label: `${j.name} — part ${j.partNumber}` })),
  ];
  return (
    <Page title="Stock check" subtitle="Measured bars against the clamp window, sorted into as few rail settings as possible.">
      <div className="max-w-xl">
        <SelectField label="Bars for" options={options} value={jobId === null ? '' : String(jobId)} className="max-sm:min-h-11"
          hint={jobs.error ? 'The list of jobs could not be loaded.' : 'Choose the job these bars are for; its rails, carrier and clearance are used, and the bars are kept with it.'}
          onChange={(e) => setParams(e.target.value ? { job: e.target.value } : {}, { replace: true })} />
      </div>
      {jobId !== null ? <JobBars id={jobId} /> : <CatalogBars />}
    </Page>
  );
}

function JobBars({ id }: { id: number }) {
  const me = useMe();
  const job = useJob(id);
  if (job.error) return <ErrorText error={job.error} />;
  if (!job.data) return <p className="text-slate-700">Loading the job…</p>;
  if (!may(me.data?.role, 'recordBars')) {
    return <Notice tone="info" title="Operators, programmers and leads record measured bars">Your role reads the checks on the job page.</Notice>;
  }
  return <JobBarEntry key={id} job={job.data} />;
}

function CatalogBars() {
  const components = useComponents();
  if (components.isPending) return <p className="text-slate-700">Loading the catalog…</p>;
  if (components.error) return <ErrorText error={components.error} />;
  return <StockCheckScreen components={components.data.items} />;
}
