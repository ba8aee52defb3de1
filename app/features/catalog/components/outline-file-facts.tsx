import type { Unit } from '../../../../shared/schemas/common';
import type { DxfInspection } from '../dxf-inspection';
import { formatDrawingSize, outlineLayers, unsupportedText } from '../outline-preview';

export const UNIT_NAMES: Record<Unit, string> = { in: 'inches (in)', mm: 'millimetres (mm)' };
const UNIT_CHOICES = (['in', 'mm'] as const).map((value) => ({ value, label: UNIT_NAMES[value] }));

/** What the file holds: entities, size, its layers (each can be hidden in the preview) and notes on what was not read. */
export function FileFacts({ inspection, unit, hidden, onToggle }: { inspection: DxfInspection; unit: Unit | null; hidden: ReadonlySet<string>; onToggle: (layer: string) => void }) {
  const stored = outlineLayers(inspection.outline);
  const notRead = unsupportedText(inspection.unsupported);
  const b = inspection.bbox;
  return (
    <div className="flex flex-col gap-3">
      <dl className="flex flex-col gap-1 text-sm">
        <div className="flex flex-wrap justify-between gap-x-3">
          <dt className="font-semibold text-slate-700">Entities</dt>
          <dd><span className="num">{inspection.entities}</span>{inspection.version ? <span className="text-slate-600"> · DXF {inspection.version}</span> : null}</dd>
        </div>
        {b ? (
          <div className="flex flex-wrap justify-between gap-x-3">
            <dt className="font-semibold text-slate-700">Size</dt>
            <dd className="num">{formatDrawingSize(b.maxX - b.minX, b.maxY - b.minY, unit)}</dd>
          </div>
        ) : null}
      </dl>
      <fieldset className="flex flex-col">
        <legend className="mb-1 text-sm font-semibold text-slate-700">Layers (show or hide in the preview)</legend>
        {inspection.layers.map((l) => (
          <label key={l.name} className="flex min-h-10 cursor-pointer items-center gap-3 rounded px-2 hover:bg-slate-100">
            <input type="checkbox" className="h-5 w-5 accent-accent-700" checked={!hidden.has(l.name)} onChange={() => onToggle(l.name)} aria-label={`Show layer ${l.name}`} />
            <span className="min-w-0 flex-1 break-all font-mono">{l.name}</span>
            <span className="num text-sm text-slate-700">{l.entities} {l.entities === 1 ? 'entity' : 'entities'}</span>
            {!stored.has(l.name) ? <span className="text-sm text-slate-600" title="Only text or points: not part of the outline">not stored</span> : null}
          </label>
        ))}
      </fieldset>
      {notRead || inspection.approximations.length || inspection.warnings.length ? (
        <div className="flex flex-col gap-1 text-sm">
          <p className="font-semibold text-slate-700">Notes</p>
          <ul className="flex list-disc flex-col gap-1 pl-5 text-slate-800">
            {notRead ? <li>{notRead} (they are not part of the outline)</li> : null}
            {inspection.approximations.map((a) => <li key={a}>{a}</li>)}
            {inspection.warnings.map((w) => <li key={w}>{w}</li>)}
          </ul>
        </div>
      ) : null}
    </div>
  );
}

/** The unit the file says, or a required choice when it says none. */
export function UnitLine({ inspection, componentUnit, chosen, error, groupName, onChoose }: { inspection: DxfInspection; componentUnit: Unit; chosen: Unit | null; error: string | null; groupName: string; onChoose: (u: Unit) => void }) {
  if (inspection.unit) {
    return (
      <p className="text-slate-800">
        <span className="font-semibold">Unit:</span> the file says {UNIT_NAMES[inspection.unit]}
        <span className="text-slate-600"> ($INSUNITS {inspection.insunits})</span>.{' '}
        {inspection.unit === componentUnit
          ? `Local positions are in the component's unit too.`
          : `Local positions are converted into the component's unit, ${UNIT_NAMES[componentUnit]}.`}
      </p>
    );
  }
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={error ? `${groupName}-error` : undefined}>
      <legend className="font-semibold text-slate-800">The file does not say its unit <span className="font-normal text-slate-600">(required: which unit was it drawn in?)</span></legend>
      <div className="flex flex-wrap gap-2">
        {UNIT_CHOICES.map((o) => (
          <label key={o.value} className={`flex min-h-10 cursor-pointer items-center gap-2 rounded border px-3 ${chosen === o.value ? 'border-accent-700 bg-accent-50' : 'border-slate-400'}`}>
            <input type="radio" name={groupName} value={o.value} className="h-5 w-5 accent-accent-700" checked={chosen === o.value} onChange={() => onChoose(o.value)} required />
            {o.label}
          </label>
        ))}
      </div>
      {error ? <p id={`${groupName}-error`} role="alert" className="text-sm text-danger-700">{error}</p> : null}
    </fieldset>
  );
}
