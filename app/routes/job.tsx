import { forwardRef, useEffect, useMemo, useRef, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Pencil } from 'lucide-react';
import { STOCK_CHECK_ADVICE } from '../../shared/clamps/reason-text';
import { may } from '../../shared/schemas/auth';
import type { ClampModel } from '../../shared/schemas/catalog';
import type { JobDetail, JobStockCheck } from '../../shared/schemas/job';
import type { TemplateSummary, TemplateVersion } from '../../shared/schemas/template-api';
import { formatLength, formatNumber } from '../../shared/units/units';
import { Page } from '../components/ui/page';
import { Button } from '../components/ui/button';
import { ErrorText, Notice } from '../components/ui/notice';
import { applyServerIssues } from '../lib/form-errors';
import { useMe } from '../features/auth/api';
import { useJob, useUpdateJob } from '../features/jobs/api';
import { formatServerTime } from '../lib/server-time';
import { checkedBeforeEdit, jobCheckRun, jobRails, railClamp, railOfCheck, type JobCheckRun, type JobRail } from '../features/jobs/job-rails';
import { JobDrawing } from '../features/jobs/components/job-drawing';
import { JobFactsLine, JobFiles, JobSetupFacts, NewerReleaseNotice, RuntimeCard } from '../features/jobs/components/job-facts';
import { FoldingSection, JumpList } from '../features/jobs/components/job-sections';
import { JobForm } from '../features/jobs/components/job-form';
import { JobProblems } from '../features/jobs/components/job-problems';
import { LoadListPanel } from '../features/jobs/components/load-list-panel';
import { PairingTable } from '../features/jobs/components/pairing-table';
import { PartOutlineUpload } from '../features/jobs/components/part-outline-upload';
import { PartProgramPanel } from '../features/jobs/components/part-program-panel';
import { useTemplates, versionFileUrl, versionQuery } from '../features/templates/api';
import { JobBarsForm } from '../features/stock-check/components/job-bar-entry';
import { BarByBar, StockCheckResults } from '../features/stock-check/components/stock-check-results';

const NO_TEMPLATES: TemplateSummary[] = [];

/** The job page's sections in page order, for the jump list at its top (the load list once there is a check). */
const jumpTargets = (checked: boolean) => [
  ...(checked ? [{ id: 'load-list', label: 'Load list' }] : []),
  { id: 'stock-check', label: 'Stock check' },
  { id: 'drawing', label: 'Drawing' },
  { id: 'job-facts', label: 'Stock and runtime' },
  { id: 'part-program', label: 'Part program' },
];

/**
 * One screen, one job: where the part sits at every station, how long a load runs, which bars go
 * on which rail setting, and the files for the machine. Operators read it all and enter bars;
 * programmers and leads also edit the job and its part outline.
 */
export function JobRoute() {
  const id = Number(useParams().id);
  const me = useMe();
  const job = useJob(id);
  const j = job.data;
  const version = useQuery({ ...versionQuery(j?.templateId ?? 0, j?.version ?? 0), enabled: !!j });
  const canEdit = may(me.data?.role, 'editJobs');
  const [editing, setEditing] = useState(false);

  if (job.error) return <Page title="Job"><ErrorText error={job.error} /><p><Link className="text-accent-700 underline" to="/jobs">All jobs</Link></p></Page>;
  if (!j) return <Page title="Job"><p className="text-slate-700">Loading the job…</p></Page>;
  const v = version.data;
  return (
    <Page
      title={j.name}
      subtitle={
        <span className="flex flex-wrap items-center gap-x-2">
          <span>Part <span className="font-mono font-semibold text-slate-900">{j.partNumber}</span>{j.partRevision ? <> rev <span className="font-mono font-semibold text-slate-900">{j.partRevision}</span></> : null}</span>
          <span aria-hidden className="max-md:hidden">·</span>
          <span>on <Link className="text-accent-700 underline" to={`/templates/${j.templateId}/versions/${j.version}`}>{j.templateName} v{j.version}</Link> ({j.versionState}, pinned)</span>
          <span aria-hidden className="max-md:hidden">·</span>
          <span className="max-md:hidden">content hash <span className="font-mono" title={j.contentHash}>{j.contentHash.slice(0, 16)}</span></span>
        </span>
      }
      actions={<JobFiles job={j} stationsCsvUrl={versionFileUrl(j.templateId, j.version, 'stations.csv')} />}
    >
      <NewerReleaseNotice job={j} canEdit={canEdit} />
      <JobFactsLine job={j} />
      <JumpList targets={jumpTargets(j.stockChecks.length > 0)} />
      <JobProblems job={j} />
      {version.error ? <ErrorText error={version.error} /> : null}

      {/* What to do next first (DESIGN.md, At the machine): the load list, then the bars, then the drawing. */}
      <LoadListPanel job={j} canEdit={may(me.data?.role, 'editLoadLists')} />
      {v ? <StockCheckSection job={j} version={v} canRecord={may(me.data?.role, 'recordBars')} /> : <p className="text-slate-700">Loading the template version…</p>}

      <div id="drawing" className="grid scroll-mt-4 grid-cols-1 items-start gap-6 border-t border-slate-300 pt-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <JobDrawing job={j} plateCode={v?.plate.code ?? ''} offsetName={v?.sharedOffset.name ?? 'shared offset'} />
        <div id="job-facts" className="flex scroll-mt-4 flex-col gap-4">
          <RuntimeCard job={j} />
          <JobSetupFacts job={j} />
          {canEdit && !editing ? (
            <Button variant="secondary" onClick={() => setEditing(true)}><Pencil aria-hidden className="h-4 w-4" />Edit job</Button>
          ) : null}
        </div>
      </div>

      {canEdit && editing ? <EditJob job={j} onDone={() => setEditing(false)} /> : null}
      {canEdit ? <PartOutlineUpload job={j} /> : null}
      <div id="part-program" className="scroll-mt-4"><PartProgramPanel job={j} canEdit={canEdit} /></div>
    </Page>
  );
}

function EditJob({ job, onDone }: { job: JobDetail; onDone: () => void }) {
  const templates = useTemplates();
  const update = useUpdateJob(job.id);
  const { name, partNumber, partRevision, templateId, version, stock, carrier, clearance, minBite, cycleMinutes, loadMinutes, partRotation, notes } = job;
  if (templates.error) return <ErrorText error={templates.error} />;
  // The selects are uncontrolled: they are drawn once their options are known, so what shows is what is sent.
  if (templates.isPending) return <p className="text-slate-700">Loading templates…</p>;
  return (
    <JobForm
      title="Edit job"
      submitLabel="Save job"
      templates={templates.data?.items ?? NO_TEMPLATES}
      defaultValues={{ name, partNumber, partRevision, templateId, version, stock, carrier, clearance, minBite, cycleMinutes, loadMinutes, partRotation, notes }}
      pending={update.isPending}
      error={update.error}
      onSubmit={(values, setError) => update.mutate(values, { onSuccess: onDone, onError: (err) => applyServerIssues(err, setError) })}
      onCancel={onDone}
    />
  );
}

/**
 * The pairing table, the bars the operator measured, and what the latest check said on the rail
 * shown. One check covers every jaw rail the job uses, each against its own clamp model.
 */
function StockCheckSection({ job, version, canRecord }: { job: JobDetail; version: TemplateVersion; canRecord: boolean }) {
  const rails = useMemo(() => jobRails(job.pairings), [job.pairings]);
  const used = useMemo(() => new Set(job.stationsUsed), [job.stationsUsed]);
  const railsUsed = useMemo(() => new Set(job.railsUsed), [job.railsUsed]);
  const clamps = useMemo(() => new Map(rails.map((r) => [r.jawComponent, railClamp(version.components, r.jawComponent, job.unit)])), [rails, version.components, job.unit]);
  const [chosen, setChosen] = useState<string | null>(null);
  const usable = (r: JobRail) => railsUsed.has(r.jawPlacement) && !!clamps.get(r.jawComponent);
  const selected = rails.find((r) => r.jawPlacement === chosen && usable(r))
    ?? rails.find((r) => r.jawPlacement === job.stockChecks[0]?.jawPlacement && usable(r))
    ?? rails.find(usable) ?? null;
  const clamp = selected ? clamps.get(selected.jawComponent) ?? null : null;
  const checks = selected ? job.stockChecks.filter((c) => railOfCheck(c, selected.jawPlacement)) : [];
  const latest = checks[0] ?? null;
  const run = useMemo(() => {
    const part = selected && latest ? railOfCheck(latest, selected.jawPlacement) : null;
    return selected && clamp && latest && part ? jobCheckRun(job, { ...latest, ...part }, railFor(selected, clamp)) : null;
  }, [job, latest, selected, clamp]);
  const resultsHeading = useRef<HTMLHeadingElement>(null);
  const [focusCheck, setFocusCheck] = useState<number | null>(null);

  // After the operator's own check, bring its answer into view (and to a screen reader).
  useEffect(() => {
    if (latest && focusCheck !== null && latest.id !== focusCheck) {
      resultsHeading.current?.focus();
      // eslint-disable-next-line react-hooks/set-state-in-effect -- clears the one-shot flag after moving focus, a DOM effect
      setFocusCheck(null);
    }
  }, [latest, focusCheck]);

  return (
    <section id="stock-check" aria-labelledby="stock-check-title" className="flex scroll-mt-4 flex-col gap-4 border-t border-slate-300 pt-4">
      <div>
        <h2 id="stock-check-title" className="text-xl font-semibold">Stock check: which bars go on which rail setting</h2>
        <p className="text-slate-700">Measure the bars and check them against the clamp window of every jaw rail this job uses, with this job’s carrier, clearance and minimum bite; choose a rail below to see its sorting.</p>
      </div>
      <PairingTable rails={rails} stations={job.stationList} used={used} unit={job.unit} selected={selected?.jawPlacement ?? null}
        onSelect={(p) => { setChosen(p); setFocusCheck(null); }} hasClamp={(code) => !!clamps.get(code)} />
      {selected && clamp ? (
        <>
          <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-[minmax(0,31rem)_minmax(0,1fr)]">
            {canRecord ? (
              <div className="flex min-w-0 flex-col gap-4">
                <ClampWindowFacts job={job} rail={selected} clamp={clamp} />
                <JobBarsForm job={job} onChecked={() => setFocusCheck(latest?.id ?? -1)} />
              </div>
            ) : <p className="text-slate-700">Operators, programmers and leads record measured bars; your role reads the checks.</p>}
            <section aria-label="Latest check" className="flex flex-col gap-4">
              {latest && run ? (
                <LatestCheck ref={resultsHeading} job={job} rail={selected} check={latest} run={run} count={checks.length} />
              ) : (
                <div className="flex flex-col gap-3 rounded border border-dashed border-slate-400 bg-white p-6 text-slate-800">
                  <h3 className="text-xl font-semibold">No bars checked on {selected.jawPlacement} yet</h3>
                  <p>Type or paste the measured bars and press <span className="font-semibold">Check the bars</span>. The sorting list, the bars that cannot be used, and a chart of every bar against each setting’s window appear here, and stay with the job.</p>
                  <Notice tone="caution" title="Advice, not a go-ahead">{STOCK_CHECK_ADVICE}</Notice>
                </div>
              )}
            </section>
          </div>
          {latest && run ? (
            <FoldingSection id="bar-by-bar" title="Every bar of the latest check" foldOnPhone>
              <BarByBar run={run} stale={checkedBeforeEdit(job, latest)} />
            </FoldingSection>
          ) : null}
        </>
      ) : rails.length > 0 && job.railsUsed.length === 0 ? (
        <Notice tone="info" title="No jaw rail holds this job's stock width">Change the stock width or pin a version with stations for it; the job's problems say which width would fit.</Notice>
      ) : rails.length > 0 ? (
        <Notice tone="info" title="No jaw rail this job uses has a clamp model">A lead adds the clamp model to the jaw rail in the catalog; a new template version then carries it.</Notice>
      ) : null}
    </section>
  );
}

const railFor = (rail: JobRail, clamp: ClampModel) => ({ code: `${rail.jawPlacement} (${rail.jawComponent})`, name: rail.jawComponent, clamp });

const LatestCheck = forwardRef<HTMLHeadingElement, { job: JobDetail; rail: JobRail; check: JobStockCheck; run: JobCheckRun; count: number }>(
  function LatestCheck({ job, rail, check, run, count }, ref) {
    return (
      <>
        <p className="text-slate-700">
          Latest check on <span className="font-mono font-semibold">{rail.jawPlacement}</span>: {formatServerTime(check.at)}{check.by ? ` by ${check.by}` : ''}
          {count > 1 ? ` · ${count} checks of this rail kept with the job` : ''}.
        </p>
        <RailsCovered check={check} />
        <StockCheckResults ref={ref} run={run} stale={checkedBeforeEdit(job, check)} clampFrom={`${job.templateName} v${job.version}`} />
      </>
    );
  },
);

/** Which rails a check covered and which rails the job uses that it did not: said on screen, as on the setup sheet. */
function RailsCovered({ check }: { check: JobStockCheck }) {
  const checked = check.rails.length ? check.rails.map((r) => r.jawPlacement) : [check.jawPlacement];
  return (
    <p className="text-slate-800" data-testid="rails-covered">
      Rails checked: <span className="font-mono font-semibold">{checked.join(', ')}</span>.{' '}
      {check.railsNotChecked.length
        ? <>Not checked: <span className="font-mono font-semibold">{check.railsNotChecked.join(', ')}</span>; check the bars for {check.railsNotChecked.length === 1 ? 'it' : 'them'} before loading.</>
        : check.rails.length ? 'Every rail this job uses was checked.' : 'This check was made on one rail only.'}
    </p>
  );
}

/** The chosen rail's clamp window and the job's own settings, beside the bars they are checked with. */
function ClampWindowFacts({ job, rail, clamp }: { job: JobDetail; rail: JobRail; clamp: ClampModel }) {
  const unit = job.unit;
  return (
    <section aria-label={`Clamp window of ${rail.jawPlacement}`} className="rounded border border-slate-300 bg-white p-3 sm:p-4">
      <p className="text-slate-700">Clamp window of <span className="font-mono font-semibold">{rail.jawPlacement}</span> <span className="font-mono">{rail.jawComponent}</span>, the rail shown:</p>
      <dl className="mt-1 grid grid-cols-[minmax(0,1fr)_auto] gap-x-4 gap-y-0.5 text-slate-800">
        {([
          ['Nominal opening', formatLength(rail.width, unit)],
          ['Width window', `−${formatNumber(clamp.acceptBelow, unit)} / +${formatLength(clamp.acceptAbove, unit)}`],
          ['Slot slop', `±${formatLength(clamp.slotSlop, unit)}`],
          ['Carrier (job)', formatLength(job.carrier, unit)],
          ['Tool clearance (job)', formatLength(job.clearance, unit)],
          ['Minimum bite (job)', formatLength(job.minBite, unit)],
        ] as const).map(([k, v]) => (
          <div key={k} className="contents"><dt>{k}</dt><dd className="num">{v}</dd></div>
        ))}
      </dl>
    </section>
  );
}
