import { useState } from 'react';
import { ExternalLink } from 'lucide-react';
import type { JobDetail } from '../../../../shared/schemas/job';
import { Notice } from '../../../components/ui/notice';
import { jobFileUrl } from '../api';

/**
 * The plate as the server draws it for the job: the template with the part's outline at every
 * station the job uses (the others greyed), turned by the station's C, origin at the shared offset. The address changes with
 * the job, so a new outline is never hidden behind a cached picture.
 */
export function JobDrawing({ job, plateCode, offsetName }: { job: JobDetail; plateCode: string; offsetName: string }) {
  const [failed, setFailed] = useState(false);
  const src = `${jobFileUrl(job.id, 'drawing.svg')}?at=${encodeURIComponent(`${job.updatedAt}-${job.partFile?.sha256.slice(0, 12) ?? 'none'}`)}`;
  return (
    <figure className="flex flex-col gap-2" aria-labelledby="job-drawing-title">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="job-drawing-title" className="text-lg font-semibold">
          {job.partOutline ? 'The part at every station used' : 'Stations on the plate'} <span className="font-normal text-slate-600">— {job.stationsUsed.length} of {job.stations} used{plateCode ? ` on ${plateCode}` : ''}</span>
        </h2>
        <a href={src} target="_blank" rel="noreferrer" title="Opens in a new tab, where the browser zooms it" className="inline-flex min-h-10 items-center gap-1 font-semibold text-accent-700 underline">
          <ExternalLink aria-hidden className="h-4 w-4" />Open the drawing full size
        </a>
      </div>
      {failed ? (
        <Notice tone="warning" title="The drawing could not be loaded">Reload the page; the station table and the setup sheet still give every position.</Notice>
      ) : (
        <div className="overflow-hidden rounded border border-slate-300 bg-white">
          <img src={src} onError={() => setFailed(true)} onLoad={() => setFailed(false)} className="block h-auto max-h-[70vh] w-full object-contain"
            alt={`${job.name}: plate ${plateCode} seen from above, +X to the right and +Y away from the operator, with ${job.stations} stations numbered, ${job.stationsUsed.length} used by this job${job.partOutline ? ' with the part outline drawn at each' : ''}${job.stationsUsed.length < job.stations ? ' and the others greyed' : ''}; origin at the shared offset ${offsetName}.`} />
        </div>
      )}
      <figcaption className="flex flex-wrap gap-x-5 gap-y-1 text-base text-slate-800">
        {job.partOutline ? (
          <span className="inline-flex items-center gap-1.5"><svg aria-hidden width="24" height="14"><rect x="1" y="1" width="22" height="12" fill="none" stroke="#0000ff" strokeWidth="2" /></svg>part outline{job.partFile ? <> from <span className="font-mono">{job.partFile.name}</span></> : null}</span>
        ) : null}
        <span className="inline-flex items-center gap-1.5"><svg aria-hidden width="16" height="16"><path d="M2 8h12M8 2v12" stroke="#333" strokeWidth="1.5" /></svg>station datum and number</span>
        {job.stationsUsed.length < job.stations ? (
          <span className="inline-flex items-center gap-1.5"><svg aria-hidden width="16" height="16"><circle cx="8" cy="8" r="5" fill="none" stroke="#a0a0a0" strokeWidth="1.5" /></svg>grey ring, “unused”: station whose width held does not take this stock</span>
        ) : null}
        <span className="inline-flex items-center gap-1.5"><svg aria-hidden width="16" height="16"><path d="M0 8h16M8 0v16" stroke="#000" strokeWidth="1.5" /></svg>shared offset {offsetName} (origin)</span>
        <span className="inline-flex items-center gap-1.5"><svg aria-hidden width="24" height="14"><rect x="1" y="1" width="22" height="12" fill="none" stroke="#505050" strokeWidth="1.5" /></svg>rails and stops, labelled placement and code</span>
      </figcaption>
    </figure>
  );
}
