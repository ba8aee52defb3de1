import { CornerUpLeft } from 'lucide-react';
import type { ChangesRequested } from '../../../../shared/schemas/template-api';
import { formatServerTime } from '../../../lib/server-time';

/** The reviewer's comment on a version sent back, said first on every screen that shows that version. */
export function ChangesRequestedNote({ changes, version }: { changes: ChangesRequested; version: number }) {
  return (
    <section role="status" aria-label={`Changes requested on v${version}`} className="flex gap-3 rounded border-2 border-dashed border-slate-800 bg-slate-100 p-3">
      <CornerUpLeft aria-hidden className="mt-0.5 h-5 w-5 shrink-0" />
      <div className="min-w-0">
        <p className="font-semibold">Changes requested on v{version}{changes.by ? ` by ${changes.by}` : ''} · <time dateTime={changes.at} className="font-normal">{formatServerTime(changes.at)}</time></p>
        <p className="break-words"><q>{changes.comment}</q></p>
        <p className="text-slate-700">Change the draft, save it, and submit it again for review.</p>
      </div>
    </section>
  );
}
