import { useEffect, useState, type ReactNode } from 'react';
import { Redo2, Undo2 } from 'lucide-react';
import { useQueryClient } from '@tanstack/react-query';
import type { Component } from '../../../../shared/schemas/catalog';
import type { Unit } from '../../../../shared/schemas/common';
import { blocksSaving, type Hole, type Pairing } from '../../../../shared/schemas/template';
import type { TemplateVersion } from '../../../../shared/schemas/template-api';
import { formatLength } from '../../../../shared/units/units';
import { columnHelperFor, DataTable } from '../../../components/ui/data-table';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { templateKeys, useSaveVersion } from '../api';
import { useLayoutDraft } from '../use-layout-draft';
import { PlateDrawing } from './plate-drawing';
import { AddPlacement, NumberingPicker, PlacementPanel, SharedOffsetPicker } from './layout-controls';
import { StationTable } from './station-table';
import { ProbeCheck } from './probe-check';
import { Downloads } from './downloads';
import { UnsavedChangesGuard } from './unsaved-guard';

interface Props {
  templateId: number;
  version: TemplateVersion;
  catalog: Component[];
  displayUnit: Unit;
  canEdit: boolean;
  probeTolerance: number;
  /** Composed in by the route (the review steps), told whether the draft has unsaved edits. */
  reviewSlot?: (state: { dirty: boolean }) => ReactNode;
}

/**
 * One screen for "where is every station?": the plate drawing and the station table follow every
 * edit at once (the shared engine runs in the browser); the draft is saved explicitly with
 * "Save draft", and a save that lost a race shows both versions instead of overwriting.
 */
const pairingCol = columnHelperFor<Pairing>();
const pairingColumns = (unit: Unit) => [
  pairingCol.accessor((p) => `${p.fixedPlacement} (${p.fixedComponent})`, { id: 'fixed', header: 'Fixed jaw' }),
  pairingCol.accessor((p) => `${p.jawPlacement} (${p.jawComponent})`, { id: 'jaw', header: 'Jaw rail' }),
  pairingCol.accessor((p) => `(${p.jawHole.col}, ${p.jawHole.row})`, { id: 'hole', header: 'On hole', meta: { numeric: true } }),
  pairingCol.accessor('width', { header: 'Width held', meta: { numeric: true }, cell: (c) => formatLength(c.getValue(), unit) }),
  pairingCol.accessor((p) => p.stations.length, { id: 'stations', header: 'Stations', meta: { numeric: true } }),
];

export function VersionEditor({ templateId, version, catalog, displayUnit, canEdit, probeTolerance, reviewSlot }: Props) {
  const editable = canEdit && version.state === 'draft';
  const layout = useLayoutDraft(version, catalog);
  const save = useSaveVersion(templateId, version.version);
  const [selected, setSelected] = useState<string | null>(null);
  const [hole, setHole] = useState<Hole>({ col: 0, row: 0 });
  const [showOrder, setShowOrder] = useState(false);
  const { evaluation, undo, redo } = layout;
  const qc = useQueryClient();

  // Ctrl+Z (Cmd+Z) undoes, Ctrl+Shift+Z and Ctrl+Y redo, anywhere on the page but in a text field,
  // whose own undo is the one a user expects there.
  useEffect(() => {
    if (!editable) return;
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey) return;
      if (e.target instanceof Element && e.target.closest('input, textarea, select, [contenteditable="true"]')) return;
      const key = e.key.toLowerCase();
      if (key === 'z' && !e.shiftKey) undo();
      else if ((key === 'z' && e.shiftKey) || (key === 'y' && !e.shiftKey)) redo();
      else return;
      e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [editable, undo, redo]);

  const conflict = save.error instanceof ApiError && save.error.code === 'stale-revision' ? (save.error.details as { current: TemplateVersion }).current : null;
  const onSave = (revision = version.revision) =>
    save.mutate({ revision, placements: layout.draft.placements, sharedOffset: layout.draft.sharedOffset, numbering: layout.draft.numbering, components: version.components });
  // Placement problems stop a save; a layout still being built (no jaw rail yet) saves, and only submit and release wait.
  const blocking = evaluation.problems.filter(blocksSaving);
  const unheld = evaluation.problems.filter((p) => !blocksSaving(p));
  const widths = [...new Set(evaluation.stations.map((s) => s.nominalWidth).filter((w): w is number => w !== null))];

  return (
    <div className="flex flex-col gap-4">
      {reviewSlot?.({ dirty: layout.dirty })}
      {editable ? <UnsavedChangesGuard dirty={layout.dirty} what={`version ${version.version}`} /> : null}
      {editable ? (
        <div className="sticky top-0 z-10 flex flex-wrap items-center gap-3 rounded border border-slate-300 bg-white p-3">
          <Button onClick={() => onSave()} disabled={!layout.dirty || save.isPending || blocking.length > 0}>{save.isPending ? 'Saving…' : 'Save draft'}</Button>
          <div className="flex gap-2" role="group" aria-label="History">
            <Button variant="secondary" onClick={undo} disabled={!layout.canUndo} title="Undo the last edit (Ctrl+Z)" aria-keyshortcuts="Control+Z Meta+Z"><Undo2 aria-hidden className="h-4 w-4" />Undo</Button>
            <Button variant="secondary" onClick={redo} disabled={!layout.canRedo} title="Redo (Ctrl+Shift+Z or Ctrl+Y)" aria-keyshortcuts="Control+Shift+Z Control+Y Meta+Shift+Z"><Redo2 aria-hidden className="h-4 w-4" />Redo</Button>
          </div>
          <span className={layout.dirty ? 'font-semibold text-warning-700' : 'text-slate-600'}>{layout.dirty ? 'Unsaved changes' : `Saved · revision ${version.revision}`}</span>
          {blocking.length > 0 ? <span className="text-danger-700">Fix the {blocking.length} placement problem{blocking.length > 1 ? 's' : ''} below to save.</span> : null}
        </div>
      ) : (
        <Notice tone="info" title={version.state === 'draft' ? 'Read only: your role does not edit templates.' : `Version ${version.version} is ${version.state}; it never changes.`}>
          {version.state !== 'draft' && canEdit ? 'Start a new draft from it to make changes.' : null}
        </Notice>
      )}
      {conflict ? (
        <Notice tone="warning" title="Someone else saved this draft after you opened it">
          <p>Their revision {conflict.revision} has {conflict.placements.length} placement(s) and {conflict.stations.length} station(s); yours has {layout.draft.placements.length} placement(s) and {evaluation.stations.length} station(s). Nothing of yours was saved.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => void qc.invalidateQueries({ queryKey: templateKeys.version(templateId, version.version) })}>Discard mine and load theirs</Button>
            <Button variant="danger" onClick={() => onSave(conflict.revision)}>Save mine over theirs</Button>
          </div>
        </Notice>
      ) : <ErrorText error={save.error} />}
      {blocking.length ? (
        <Notice tone="danger" title={`This layout cannot be built as it stands (${blocking.length} problem${blocking.length > 1 ? 's' : ''})`}>
          <ul className="list-disc pl-5">{blocking.slice(0, 12).map((p, i) => <li key={i}>{p.message}</li>)}</ul>
        </Notice>
      ) : null}
      {unheld.length ? (
        <Notice tone="warning" title={`Not every part is held yet (${unheld.length} problem${unheld.length > 1 ? 's' : ''}): the draft saves, but cannot be submitted or released until these are fixed`}>
          <ul className="list-disc pl-5">{unheld.slice(0, 12).map((p, i) => <li key={i}>{p.message}</li>)}</ul>
        </Notice>
      ) : null}

      <div className="grid grid-cols-1 gap-4 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="flex flex-col gap-2">
          <div className="rounded border border-slate-300 bg-white">
            <PlateDrawing
              content={layout.content}
              stations={evaluation.stations}
              origin={evaluation.origin}
              displayUnit={displayUnit}
              selectedPlacement={selected}
              onSelectPlacement={setSelected}
              onHoleClick={(h) => {
                // With a placement selected, a hole click moves its primary dowel there; otherwise it picks the hole for a new one.
                if (editable && selected) layout.movePlacement(selected, h);
                else setHole(h);
              }}
              {...(editable ? { onMovePlacement: layout.movePlacement, checkMove: layout.refusal, onRotatePlacement: layout.rotatePlacement } : {})}
              showOrder={showOrder}
              problems={evaluation.problems}
              height="min(34rem, max(18rem, 75vw))"
            />
          </div>
          <label className="flex min-h-10 items-center gap-2"><input type="checkbox" className="h-5 w-5" checked={showOrder} onChange={(e) => setShowOrder(e.target.checked)} />Show machining order</label>
          <p className="text-slate-700">
            {evaluation.stations.length} stations · widths held: {widths.length ? widths.map((w) => formatLength(w, version.unit)).join(', ') : 'none'} · plate {version.plate.code}, pitch {formatLength(version.plate.pitch, version.plate.unit)}
          </p>
        </div>
        <aside className="flex flex-col gap-3" aria-label="Layout controls">
          <PlacementPanel layout={layout} selected={selected} onSelect={setSelected} readOnly={!editable} />
          <AddPlacement layout={layout} catalog={catalog} hole={hole} setHole={setHole} readOnly={!editable} />
          <SharedOffsetPicker layout={layout} readOnly={!editable} />
          <NumberingPicker layout={layout} stations={evaluation.stations} readOnly={!editable} />
        </aside>
      </div>
      <StationTable stations={evaluation.stations} unit={version.unit} displayUnit={displayUnit} />
      {evaluation.pairings.length ? (
        <section aria-labelledby="pairings-title" className="flex flex-col gap-2">
          <h2 id="pairings-title" className="text-lg font-semibold">Widths held</h2>
          <DataTable caption="Widths held: each jaw rail and the fixed jaw it faces" columns={pairingColumns(version.unit)} data={evaluation.pairings} />
        </section>
      ) : null}
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
        <Downloads templateId={templateId} version={version} dirty={layout.dirty} />
        <ProbeCheck stations={version.stations} unit={version.unit} displayUnit={displayUnit} tolerance={probeTolerance} />
      </div>
    </div>
  );
}
