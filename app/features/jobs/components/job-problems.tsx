import type { JobDetail } from '../../../../shared/schemas/job';
import { Notice } from '../../../components/ui/notice';
import { stationRuns } from '../job-format';

/**
 * What stands in the way of running the job as saved: stock that fits no station, settings no
 * bar could pass, a part that overlaps. The job is kept with them; each says what to change.
 */
export function JobProblems({ job }: { job: Pick<JobDetail, 'problems'> }) {
  if (!job.problems.length) return null;
  const n = job.problems.length;
  return (
    <section aria-label="Job problems" data-testid="job-problems">
      <Notice tone="warning" title={n === 1 ? 'One thing to fix before this job runs' : `${n} things to fix before this job runs`}>
        <ul className="mt-1 list-disc pl-5 text-slate-900">
          {job.problems.map((p, i) => (
            <li key={`${p.code}-${i}`} data-code={p.code}>
              {p.message}
              {p.stations?.length ? <span className="text-slate-700"> (stations <span className="font-mono [font-variant-numeric:tabular-nums]">{stationRuns(p.stations)}</span>)</span> : null}
            </li>
          ))}
        </ul>
      </Notice>
    </section>
  );
}
