import { Link } from 'react-router-dom';
import { ArrowUpCircle } from 'lucide-react';
import type { JobSummary } from '../../../../shared/schemas/job';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';
import { formatHoursMinutes, formatMinutes } from '../job-format';

/** The comparison screen between the job's pinned version and the newer release. */
export const compareUrl = (j: Pick<JobSummary, 'templateId' | 'version' | 'newerRelease'>) =>
  `/templates/${j.templateId}/compare?from=${j.version}&to=${j.newerRelease}`;

/** "newer release v3" in words, linking to what changed; the job itself stays on its pinned version. */
export function NewerReleaseBadge({ job }: { job: Pick<JobSummary, 'templateId' | 'version' | 'newerRelease'> }) {
  if (job.newerRelease === null) return null;
  return (
    <Link to={compareUrl(job)} title={`Version ${job.newerRelease} of this template is released; this job stays on v${job.version}. Compare them.`}
      className="inline-flex min-h-8 items-center gap-1 whitespace-nowrap rounded border border-accent-700 px-2 text-sm font-semibold text-accent-800 underline-offset-2 hover:bg-accent-50 hover:underline">
      <ArrowUpCircle aria-hidden className="h-4 w-4" />newer release v{job.newerRelease}
    </Link>
  );
}

const col = columnHelperFor<JobSummary>();
const columns = col.columns([
  col.accessor('name', { header: 'Job', cell: (c) => <Link className="font-semibold text-accent-700 underline" to={`/jobs/${c.row.original.id}`}>{c.getValue()}</Link> }),
  col.accessor((j) => `${j.partNumber} ${j.partRevision}`.trim(), { id: 'part', header: 'Part', cell: (c) => (
    <span className="whitespace-nowrap"><span className="font-mono">{c.row.original.partNumber}</span>{c.row.original.partRevision ? <span className="text-slate-700"> rev <span className="font-mono">{c.row.original.partRevision}</span></span> : null}</span>
  ) }),
  col.accessor((j) => `${j.templateName} v${j.version}`, { id: 'template', header: 'Template', cell: (c) => {
    const j = c.row.original;
    return (
      <span className="flex flex-wrap items-center gap-2">
        <Link className="text-accent-700 underline" to={`/templates/${j.templateId}/versions/${j.version}`}>{j.templateName}</Link>
        <span className="num">v{j.version}</span>
        <NewerReleaseBadge job={j} />
      </span>
    );
  } }),
  col.accessor('stations', { header: 'Stations', meta: { numeric: true } }),
  col.accessor('runtimeMinutes', { header: 'Runtime', meta: { numeric: true }, cell: (c) => (
    <span>{formatMinutes(c.getValue())} <span className="text-slate-600">· {formatHoursMinutes(c.getValue())} h</span></span>
  ) }),
  col.accessor((j) => (j.hasPartOutline ? 'drawn' : 'none yet'), { id: 'outline', header: 'Part outline' }),
]);

/** Every job: the part, the pinned template version, and how long one load runs unattended. */
export function JobsTable({ jobs, filter }: { jobs: JobSummary[]; filter: string }) {
  return <DataTable caption="Jobs" columns={columns} data={jobs} filter={filter} getRowId={(j) => String(j.id)} empty="No jobs yet." />;
}
