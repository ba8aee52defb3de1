// The plate drawing's surroundings: the pointer readout under it, the comparison legend above it,
// and the words that follow a drag over it.
import { useImperativeHandle, useState, type Ref } from 'react';
import { AlertOctagon, Move } from 'lucide-react';
import type { Point, Unit } from '../../../../shared/schemas/common';
import { pointerReadout, type PlacementChanges, type PlateScene } from './plate-drawing-scene';
import type { DragState } from './plate-drawing-drag';

// ---------- the pointer readout: its own state, so a pointer move repaints one line ----------

export interface ReadoutHandle {
  show(platePoint: Point | null): void;
}

export function PointerReadout({ handle, plate, origin, displayUnit, offsetName }: {
  handle: Ref<ReadoutHandle>;
  plate: PlateScene;
  origin: Point;
  displayUnit: Unit;
  offsetName: string;
}) {
  const [at, setAt] = useState<Point | null>(null);
  useImperativeHandle(handle, () => ({ show: setAt }), []);
  if (!at) {
    return <p className="min-h-10 flex-1 py-2 text-base text-slate-600">Point at the plate to read X and Y from the {offsetName}.</p>;
  }
  const r = pointerReadout(at, plate, origin, displayUnit);
  return (
    // aria-live off: a value per pointer move would drown a screen reader; the titles tell the story.
    <p aria-live="off" className="min-h-10 flex-1 py-2 text-base">
      <span className="sr-only">Pointer, from the {offsetName}: </span>
      <span className="num inline-block min-w-[11ch]">X {r.x}</span>{' '}
      <span className="num ml-3 inline-block min-w-[11ch]">Y {r.y}</span>{' '}
      <span className="ml-3 text-slate-700">{r.hole ? <>nearest hole <span className="num">({r.hole.col}, {r.hole.row})</span></> : 'off the grid'}</span>
    </p>
  );
}

// ---------- the comparison legend: above the drawing, so zooming never hides it ----------

export function ComparisonLegend({ changes, olderLabel, newerLabel, printMode }: { changes: PlacementChanges; olderLabel: string; newerLabel: string; printMode: boolean }) {
  const stroke = printMode ? 'stroke-black' : 'stroke-slate-700';
  const fill = printMode ? 'fill-black' : 'fill-slate-700';
  const faint = printMode ? 'stroke-black' : 'stroke-slate-500';
  const list = (ids: readonly string[]) => (ids.length <= 8 ? ids.join(', ') : `${ids.slice(0, 8).join(', ')} and ${ids.length - 8} more`);
  const moved = changes.moved.map((m) => m.id);
  return (
    <div role="group" aria-label="Legend" className="flex flex-wrap items-center gap-x-5 gap-y-1 text-sm text-slate-800">
      <span className="font-semibold">Legend</span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><line x1="1" y1="6" x2="31" y2="6" className={faint} strokeWidth="1.5" strokeDasharray="5 4" /></svg>
        {olderLabel} (dashed)
      </span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><rect x="1" y="2" width="30" height="8" className={`${printMode ? 'fill-white' : 'fill-slate-300/70'} ${stroke}`} strokeWidth="1" /></svg>
        {newerLabel} (solid)
      </span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><path d="M1 6H24" className={stroke} strokeWidth="2" /><path d="M31 6L23 1.5V10.5Z" className={fill} /></svg>
        moved, old → new: {moved.length ? <span className="font-mono">{list(moved)}</span> : 'none'}
      </span>
      {changes.turned.length ? <span>turned in place: <span className="font-mono">{list(changes.turned)}</span></span> : null}
      {changes.added.length ? <span>added: <span className="font-mono">{list(changes.added)}</span></span> : null}
      {changes.removed.length ? <span>removed: <span className="font-mono">{list(changes.removed)}</span></span> : null}
    </div>
  );
}

// ---------- a drag in words: where it would land, or why it cannot ----------

export function DragStatus({ drag, notice }: { drag: DragState | null; notice: string | null }) {
  if (!drag && notice) {
    return (
      <p role="status" aria-live="polite" data-testid="drag-status"
        className="pointer-events-none absolute left-2 right-2 top-2 flex items-start gap-2 rounded border border-danger-700 bg-white/95 px-2 py-1 text-base font-semibold text-danger-700 sm:right-auto">
        <AlertOctagon aria-hidden className="mt-1 h-4 w-4 shrink-0" />{notice}
      </p>
    );
  }
  // Always in the document, so a screen reader hears each change of the live region.
  return (
    <p role="status" aria-live="polite" data-testid="drag-status"
      className={drag ? `pointer-events-none absolute left-2 right-2 top-2 flex items-start gap-2 rounded border bg-white/95 px-2 py-1 text-base font-semibold sm:right-auto ${drag.refusal ? 'border-danger-700 text-danger-700' : 'border-accent-700 text-accent-800'}` : 'sr-only'}>
      {drag ? (
        drag.refusal ? (
          <><AlertOctagon aria-hidden className="mt-1 h-4 w-4 shrink-0" />{`${drag.refusal} Let go to leave it where it was.`}</>
        ) : (
          <><Move aria-hidden className="mt-1 h-4 w-4 shrink-0" />{drag.moved ? `${drag.id} to hole (${drag.hole.col}, ${drag.hole.row}): let go to drop it there.` : `${drag.id} stays on hole (${drag.hole.col}, ${drag.hole.row}).`}</>
        )
      ) : null}
    </p>
  );
}
