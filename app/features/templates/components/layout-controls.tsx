import { useState } from 'react';
import { ArrowDown, ArrowLeft, ArrowRight, ArrowUp, RotateCcw, Trash2 } from 'lucide-react';
import type { Component } from '../../../../shared/schemas/catalog';
import { NUMBERING_ORDERS, type Hole, type Placement, type Rotation, type SharedOffset, type Station } from '../../../../shared/schemas/template';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import type { LayoutDraftState } from '../use-layout-draft';

const ROTATIONS: Rotation[] = [0, 90, 180, 270];
const NUMBERING_LABELS: Record<(typeof NUMBERING_ORDERS)[number], string> = {
  'row-by-row': 'Row by row', serpentine: 'Serpentine', 'by-rail': 'By rail', 'by-hand': 'By hand',
};

function nextId(placements: Placement[], code: string) {
  const stem = code.replace(/[^A-Za-z0-9]+/g, '').slice(0, 12) || 'P';
  for (let k = 1; ; k++) if (!placements.some((p) => p.id === `${stem}-${k}`)) return `${stem}-${k}`;
}

/** Add a placement on a hole; clicking a hole in the drawing fills the hole fields. */
export function AddPlacement({ layout, catalog, hole, setHole, readOnly }: { layout: LayoutDraftState; catalog: Component[]; hole: Hole; setHole: (h: Hole) => void; readOnly: boolean }) {
  // The catalog may arrive after the form mounts: until a component is chosen (or when the chosen
  // one is gone), the first of the catalog is the choice.
  const [chosen, setCode] = useState<string | null>(null);
  const code = chosen !== null && catalog.some((c) => c.code === chosen) ? chosen : catalog[0]?.code ?? '';
  const [rotation, setRotation] = useState<Rotation>(0);
  if (readOnly) return null;
  const add = () => {
    const component = catalog.find((c) => c.code === code);
    if (!component) return;
    const placement: Placement = { id: nextId(layout.draft.placements, code), component: code, hole, rotation, stopsInUse: component.stops.map((_, i) => i) };
    layout.update({ placements: [...layout.draft.placements, placement] });
  };
  return (
    <fieldset className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-3">
      <legend className="px-1 font-semibold">Add a placement</legend>
      <label className="flex flex-col text-sm font-semibold text-slate-700">Component
        <select className={inputClass} value={code} onChange={(e) => setCode(e.target.value)}>
          {catalog.map((c) => <option key={c.id} value={c.code}>{c.code} — {c.name}</option>)}
        </select>
      </label>
      <div className="flex flex-wrap gap-2">
        <label className="flex flex-col text-sm font-semibold text-slate-700">Hole column
          <input type="number" className={`${inputClass} num w-24`} value={hole.col} onChange={(e) => setHole({ ...hole, col: Math.trunc(Number(e.target.value)) })} />
        </label>
        <label className="flex flex-col text-sm font-semibold text-slate-700">Hole row
          <input type="number" className={`${inputClass} num w-24`} value={hole.row} onChange={(e) => setHole({ ...hole, row: Math.trunc(Number(e.target.value)) })} />
        </label>
        <label className="flex flex-col text-sm font-semibold text-slate-700">Rotation
          <select className={`${inputClass} w-28`} value={rotation} onChange={(e) => setRotation(Number(e.target.value) as Rotation)}>
            {ROTATIONS.map((r) => <option key={r} value={r}>{r}°</option>)}
          </select>
        </label>
      </div>
      <p className="text-sm text-slate-600">The primary dowel goes in the hole; with no placement selected, click a hole on the drawing to pick it.</p>
      <div><Button onClick={add} disabled={!code}>Add placement</Button></div>
    </fieldset>
  );
}

/** The selected placement: move it hole by hole, turn it, choose its stops, remove it. */
export function PlacementPanel({ layout, selected, onSelect, readOnly }: { layout: LayoutDraftState; selected: string | null; onSelect: (id: string | null) => void; readOnly: boolean }) {
  const p = layout.draft.placements.find((x) => x.id === selected);
  const placements = layout.draft.placements;
  const replace = (next: Placement) => layout.update({ placements: placements.map((x) => (x.id === next.id ? next : x)) });
  const component = p ? layout.components.get(p.component) : undefined;
  return (
    <section className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-3" aria-labelledby="placements-title">
      <h2 id="placements-title" className="font-semibold">Placements ({placements.length})</h2>
      <ul className="flex max-h-56 flex-col overflow-auto">
        {placements.map((x) => (
          <li key={x.id}>
            <button type="button" onClick={() => onSelect(x.id === selected ? null : x.id)} aria-pressed={x.id === selected}
              className={`flex min-h-10 w-full items-center justify-between gap-2 rounded px-2 text-left ${x.id === selected ? 'bg-accent-700 text-white' : 'hover:bg-slate-100'}`}>
              <span className="font-mono font-semibold">{x.id}</span>
              <span className="font-mono text-sm">{x.component} · ({x.hole.col}, {x.hole.row}) · {x.rotation}°</span>
            </button>
          </li>
        ))}
      </ul>
      {p && !readOnly ? (
        <div className="flex flex-col gap-2 border-t border-slate-200 pt-2">
          <p className="font-semibold">{p.id}: {p.component} on hole ({p.hole.col}, {p.hole.row}) at {p.rotation}°</p>
          <p className="text-sm text-slate-600">Drag it on the drawing to another hole, click a hole to move its primary dowel there, or use the buttons (arrow keys and R on the focused drawing).</p>
          <div className="flex flex-wrap gap-1" role="group" aria-label="Move by one hole">
            <Button variant="secondary" aria-label="Move one hole left (−X)" onClick={() => replace({ ...p, hole: { ...p.hole, col: p.hole.col - 1 } })}><ArrowLeft aria-hidden className="h-4 w-4" />−X</Button>
            <Button variant="secondary" aria-label="Move one hole right (+X)" onClick={() => replace({ ...p, hole: { ...p.hole, col: p.hole.col + 1 } })}><ArrowRight aria-hidden className="h-4 w-4" />+X</Button>
            <Button variant="secondary" aria-label="Move one hole back (+Y)" onClick={() => replace({ ...p, hole: { ...p.hole, row: p.hole.row + 1 } })}><ArrowUp aria-hidden className="h-4 w-4" />+Y</Button>
            <Button variant="secondary" aria-label="Move one hole forward (−Y)" onClick={() => replace({ ...p, hole: { ...p.hole, row: p.hole.row - 1 } })}><ArrowDown aria-hidden className="h-4 w-4" />−Y</Button>
            <Button variant="secondary" title="Turn a quarter turn counter-clockwise (key R on the drawing)" onClick={() => layout.rotatePlacement(p.id)}><RotateCcw aria-hidden className="h-4 w-4" />Turn 90° (R)</Button>
            <Button variant="danger" onClick={() => { layout.update({ placements: placements.filter((x) => x.id !== p.id) }); onSelect(null); }}><Trash2 aria-hidden className="h-4 w-4" />Remove</Button>
          </div>
          {component && component.stops.length ? (
            <fieldset className="flex flex-wrap gap-2">
              <legend className="text-sm font-semibold text-slate-700">Stops in use</legend>
              {component.stops.map((_, i) => (
                <label key={i} className="flex min-h-10 items-center gap-1 rounded border border-slate-300 px-2">
                  <input type="checkbox" className="h-5 w-5" checked={p.stopsInUse.includes(i)}
                    onChange={(e) => replace({ ...p, stopsInUse: e.target.checked ? [...p.stopsInUse, i].sort((a, b) => a - b) : p.stopsInUse.filter((s) => s !== i) })} />
                  {i + 1}
                </label>
              ))}
            </fieldset>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

export function SharedOffsetPicker({ layout, readOnly }: { layout: LayoutDraftState; readOnly: boolean }) {
  const so = layout.draft.sharedOffset;
  const name = so.name ?? '';
  const set = (next: SharedOffset) => layout.update({ sharedOffset: next });
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-3">
      <legend className="px-1 font-semibold">Shared work offset</legend>
      <div className="flex flex-wrap gap-2">
        <label className="flex flex-col text-sm font-semibold text-slate-700">Origin at
          <select className={`${inputClass} w-44`} value={so.kind} onChange={(e) => {
            const kind = e.target.value;
            set(kind === 'hole' ? { kind, hole: { col: 0, row: 0 }, name } : kind === 'point' ? { kind, x: 0, y: 0, z: 0, name } : { kind: 'center', name });
          }}>
            <option value="hole">a grid hole</option>
            <option value="center">the plate center</option>
            <option value="point">a point</option>
          </select>
        </label>
        <label className="flex flex-col text-sm font-semibold text-slate-700">Name
          <input className={`${inputClass} w-28`} value={name} maxLength={40} onChange={(e) => layout.update({ sharedOffset: { ...so, name: e.target.value } }, 'offset-name')} />
        </label>
      </div>
      {so.kind === 'hole' ? (
        <div className="flex gap-2">
          <label className="flex flex-col text-sm font-semibold text-slate-700">Column<input type="number" className={`${inputClass} num w-24`} value={so.hole.col} onChange={(e) => set({ ...so, hole: { ...so.hole, col: Math.trunc(Number(e.target.value)) } })} /></label>
          <label className="flex flex-col text-sm font-semibold text-slate-700">Row<input type="number" className={`${inputClass} num w-24`} value={so.hole.row} onChange={(e) => set({ ...so, hole: { ...so.hole, row: Math.trunc(Number(e.target.value)) } })} /></label>
        </div>
      ) : so.kind === 'point' ? (
        <div className="flex gap-2">
          {(['x', 'y', 'z'] as const).map((k) => (
            <label key={k} className="flex flex-col text-sm font-semibold text-slate-700">{k.toUpperCase()} ({layout.content.unit})
              <input type="number" step="any" className={`${inputClass} num w-28`} value={so[k]} onChange={(e) => set({ ...so, [k]: Number(e.target.value) })} />
            </label>
          ))}
        </div>
      ) : <p className="text-sm text-slate-600">The center of the hole grid.</p>}
    </fieldset>
  );
}

export function NumberingPicker({ layout, stations, readOnly }: { layout: LayoutDraftState; stations: Station[]; readOnly: boolean }) {
  const n = layout.draft.numbering;
  const manual = n.manual ?? stations.map((s) => s.id);
  const move = (i: number, d: number) => {
    const next = [...manual];
    const [x] = next.splice(i, 1);
    next.splice(i + d, 0, x!);
    layout.update({ numbering: { order: 'by-hand', manual: next } });
  };
  return (
    <fieldset disabled={readOnly} className="flex flex-col gap-2 rounded border border-slate-300 bg-white p-3">
      <legend className="px-1 font-semibold">Station numbering</legend>
      <select aria-label="Numbering order" className={inputClass} value={n.order}
        onChange={(e) => layout.update({ numbering: e.target.value === 'by-hand' ? { order: 'by-hand', manual: stations.map((s) => s.id) } : { order: e.target.value as typeof n.order } })}>
        {NUMBERING_ORDERS.map((o) => <option key={o} value={o}>{NUMBERING_LABELS[o]}</option>)}
      </select>
      {n.order === 'by-hand' ? (
        <ol className="flex max-h-56 flex-col overflow-auto">
          {manual.map((id, i) => (
            <li key={id} className="flex items-center gap-1">
              <span className="num w-8">{i + 1}</span><span className="flex-1 font-mono">{id}</span>
              <Button variant="ghost" aria-label={`Move ${id} earlier`} disabled={i === 0} onClick={() => move(i, -1)}><ArrowUp aria-hidden className="h-4 w-4" /></Button>
              <Button variant="ghost" aria-label={`Move ${id} later`} disabled={i === manual.length - 1} onClick={() => move(i, 1)}><ArrowDown aria-hidden className="h-4 w-4" /></Button>
            </li>
          ))}
        </ol>
      ) : null}
      <p className="text-sm text-slate-600">A station keeps its identity (placement and stop) whatever its number.</p>
    </fieldset>
  );
}
