import { useId, useMemo, useState, type ChangeEvent } from 'react';
import { AlertTriangle, CheckCircle2, FileUp, RotateCcw } from 'lucide-react';
import type { Point, Unit } from '../../../../shared/schemas/common';
import type { Component } from '../../../../shared/schemas/catalog';
import type { NamingProblem, NamingRule } from '../../../../shared/schemas/naming';
import { checkName } from '../../../../shared/naming/check-name';
import { convert, formatLength } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { inputClass } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { usePlates, useSaveComponent } from '../api';
import type { DxfInspection } from '../dxf-inspection';
import { useInspectDxf, useSetComponentOutline } from '../outline-api';
import {
  componentWith, defaultRoles, dowelsFromCircles, formatDrawingCell, formatDrawingLength, formatDrawingSize, gridOffset, groupCircles, initialMapping, layerMapFor,
  localPoint, namingProblemsByFileLayer, outlineLayers, platesOfDiameter, progressText, stopsFromCircles, targetName, unsupportedText,
  type CircleGroup, type CircleRoles, type PlateHole,
} from '../outline-preview';
import { OutlineDrawing, type CircleMark } from './outline-drawing';

const UNIT_NAMES: Record<Unit, string> = { in: 'inches (in)', mm: 'millimetres (mm)' };
const UNIT_CHOICES = (['in', 'mm'] as const).map((value) => ({ value, label: UNIT_NAMES[value] }));

/** What was sent when the outline was stored: the dowel offer afterwards must use the same primary. */
interface StoredWith {
  fileName: string;
  fileUnit: Unit;
  roles: CircleRoles;
  dowelOrder: number[];
}

/**
 * "Outline from a drawing": read a DXF (nothing stored), look at it, say which circles are the
 * locating dowels and which one is the primary (it becomes the local origin), give every layer
 * a conforming name, then store the outline; afterwards, optionally set the dowels too.
 */
export function OutlineImport({ component, layerRule }: { component: Component; layerRule?: NamingRule }) {
  const inspect = useInspectDxf();
  const store = useSetComponentOutline(component.id);
  const saveDowels = useSaveComponent(component.id);
  const plates = usePlates();
  const [file, setFile] = useState<File | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [chosenUnit, setChosenUnit] = useState<Unit | null>(null);
  const [unitError, setUnitError] = useState<string | null>(null);
  const [hidden, setHidden] = useState<ReadonlySet<string>>(new Set());
  const [rolesOverride, setRolesOverride] = useState<CircleRoles | null>(null);
  const [mapping, setMapping] = useState<Record<string, string>>({});
  const [refusals, setRefusals] = useState<Record<string, { target: string; problems: NamingProblem[] }>>({});
  const [storedWith, setStoredWith] = useState<StoredWith | null>(null);
  const unitGroup = useId();

  const inspection = file ? inspect.data ?? null : null;
  const fileUnit = inspection?.unit ?? chosenUnit;
  const plateHoles = useMemo<PlateHole[]>(() => (plates.data?.items ?? []).map((p) => ({ code: p.code, unit: p.unit, holeDiameter: p.holeDiameter, pitch: p.pitch })), [plates.data]);
  const groups = useMemo(() => (inspection ? groupCircles(inspection.circles, fileUnit) : []), [inspection, fileUnit]);
  // Until the user changes a tick, the guess follows what is known (plates load, a unit is chosen).
  const roles = rolesOverride ?? defaultRoles(groups, fileUnit, plateHoles);
  const dowelGroup = groups.find((g) => g.key === roles.dowelKey) ?? null;
  const dowelOrder = dowelOrderOf(roles, dowelGroup);
  const stored = storedWith ? store.data ?? null : null;

  function reset() {
    setProgress(null);
    setChosenUnit(null);
    setUnitError(null);
    setHidden(new Set());
    setRolesOverride(null);
    setMapping({});
    setRefusals({});
    setStoredWith(null);
    store.reset();
    saveDowels.reset();
  }

  function pick(e: ChangeEvent<HTMLInputElement>) {
    const f = e.target.files?.[0] ?? null;
    e.target.value = ''; // so picking the same file again reads it again
    if (!f) return;
    reset();
    setFile(f);
    inspect.mutate(
      { file: f, onProgress: setProgress },
      { onSuccess: (r) => setMapping(initialMapping(r.layers.filter((l) => outlineLayers(r.outline).has(l.name)))), onSettled: () => setProgress(null) },
    );
  }

  function use() {
    if (!file || !inspection) return;
    if (!fileUnit) {
      setUnitError('Choose the unit the drawing is in: the file does not say.');
      return;
    }
    const primary = roles.primary !== null ? inspection.circles[roles.primary] ?? null : null;
    const snapshot: StoredWith = { fileName: file.name, fileUnit, roles, dowelOrder };
    store.mutate(
      { upload: { file, unit: inspection.unit ? null : fileUnit, datum: primary ? { x: primary.x, y: primary.y } : null, layerMap: layerMapFor(mapping) }, onProgress: setProgress },
      {
        onSuccess: () => {
          setRefusals({});
          setStoredWith(snapshot);
        },
        onError: (err) => {
          if (!(err instanceof ApiError)) return;
          if (err.code === 'naming') {
            const byLayer = namingProblemsByFileLayer(err.details, mapping, Object.keys(mapping));
            if (byLayer) setRefusals(Object.fromEntries(Object.entries(byLayer).map(([l, problems]) => [l, { target: targetName(l, mapping), problems }])));
          }
          if (err.code === 'dxf-unit-unknown') setUnitError(err.message);
        },
        onSettled: () => setProgress(null),
      },
    );
  }

  const setRoles = (next: CircleRoles) => setRolesOverride(next);

  return (
    <section aria-labelledby="outline-import" className="flex max-w-6xl flex-col gap-4 rounded border border-slate-300 bg-white p-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id="outline-import" className="text-lg font-semibold">Outline from a drawing</h2>
          <p className="text-sm text-slate-600">Read a DXF of {component.code}: nothing is stored until you use the outline.</p>
        </div>
        <label className="inline-flex min-h-10 cursor-pointer items-center gap-2 rounded bg-accent-700 px-4 py-2 font-semibold text-white focus-within:outline focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-accent-600 hover:bg-accent-800">
          <FileUp aria-hidden className="h-5 w-5" />
          <span>{file ? 'Choose another DXF file' : 'Choose a DXF file'}</span>
          <input type="file" accept=".dxf,.DXF,application/dxf,image/vnd.dxf" className="sr-only" onChange={pick} aria-label="Choose a DXF file" />
        </label>
      </div>

      {file ? (
        <p className="text-slate-800">
          <span className="font-semibold">{file.name}</span> <span className="num inline-block text-slate-600">{(file.size / 1024).toFixed(1)} KiB</span>
          {inspect.isPending ? <span role="status" className="ml-3 text-slate-700">{progressText(progress, 'Reading the drawing…')}</span> : null}
        </p>
      ) : null}
      {file ? <ErrorText error={inspect.error} /> : null}

      {inspection && !stored ? (
        <>
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_19rem]">
            <div className="flex flex-col gap-2">
              <OutlineDrawing outline={inspection.outline} title={`Preview of ${file!.name}, seen from above`} hiddenLayers={hidden} marks={marksOf(roles, dowelOrder)} />
              <p className="text-sm text-slate-600">Seen from above: +X to the right, +Y up. Ticked dowels are drawn bold, the primary with a cross; stops dashed.</p>
            </div>
            <FileFacts inspection={inspection} unit={fileUnit} hidden={hidden} onToggle={(l) => setHidden((h) => toggled(h, l))} />
          </div>

          <UnitLine inspection={inspection} componentUnit={component.unit} chosen={chosenUnit} error={unitError} groupName={unitGroup}
            onChoose={(u) => { setChosenUnit(u); setUnitError(null); setRolesOverride(null); }} />

          <CircleTables inspection={inspection} groups={groups} roles={roles} dowelOrder={dowelOrder} fileUnit={fileUnit} component={component} plates={plateHoles} onChange={setRoles} />

          <LayerMapping inspection={inspection} mapping={mapping} refusals={refusals} layerRule={layerRule} componentLayer={component.layer}
            onChange={(layer, value) => setMapping((m) => ({ ...m, [layer]: value }))}
            onAll={(value) => setMapping((m) => Object.fromEntries(Object.keys(m).map((k) => [k, value])))} />

          <div className="flex flex-col gap-2">
            {roles.primary === null ? (
              <Notice tone="caution" title="No primary dowel is chosen">The drawing's own origin (0, 0) becomes the component's local origin. Tick a dowel circle above to put the origin on it.</Notice>
            ) : null}
            {store.error && !(store.error instanceof ApiError && (store.error.code === 'naming' || store.error.code === 'dxf-unit-unknown')) ? <ErrorText error={store.error} /> : null}
            {store.error instanceof ApiError && store.error.code === 'naming' ? (
              <Notice tone="danger" title="Some layers do not fit the naming convention">Give them conforming names in the layer table above; each refused layer says why.</Notice>
            ) : null}
            <div className="flex flex-wrap items-center gap-3">
              <Button onClick={use} disabled={store.isPending}>{store.isPending ? 'Storing…' : 'Use this outline'}</Button>
              {store.isPending ? <span role="status" className="text-slate-700">{progressText(progress, 'Storing the outline…')}</span> : null}
              <span className="text-sm text-slate-600">Replaces the outline of {component.code}; dowels and stops stay as they are until you set them.</span>
            </div>
          </div>
        </>
      ) : null}

      {stored && storedWith && inspection ? (
        <StoredPanel component={stored} storedWith={storedWith} inspection={inspection} save={saveDowels}
          onAnother={() => { reset(); setFile(null); inspect.reset(); }} />
      ) : null}
    </section>
  );
}

function toggled(set: ReadonlySet<string>, key: string): Set<string> {
  const next = new Set(set);
  if (next.has(key)) next.delete(key);
  else next.add(key);
  return next;
}

/** The component's dowel order: the primary first, then the other ticked dowels left to right. */
function dowelOrderOf(roles: CircleRoles, group: CircleGroup | null): number[] {
  const ticked = new Set(roles.dowels);
  const rest = (group?.indices ?? []).filter((i) => ticked.has(i) && i !== roles.primary);
  return roles.primary !== null ? [roles.primary, ...rest] : rest;
}

function marksOf(roles: CircleRoles, dowelOrder: number[]): CircleMark[] {
  return [
    ...dowelOrder.map((index, n): CircleMark => ({ index, kind: n === 0 && index === roles.primary ? 'primary' : 'dowel', label: n === 0 && index === roles.primary ? 'D1 primary' : `D${n + 1}` })),
    ...roles.stops.map((index, n): CircleMark => ({ index, kind: 'stop', label: `S${n + 1}` })),
  ];
}

// ---------- what the file holds ----------

function FileFacts({ inspection, unit, hidden, onToggle }: { inspection: DxfInspection; unit: Unit | null; hidden: ReadonlySet<string>; onToggle: (layer: string) => void }) {
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

function UnitLine({ inspection, componentUnit, chosen, error, groupName, onChoose }: { inspection: DxfInspection; componentUnit: Unit; chosen: Unit | null; error: string | null; groupName: string; onChoose: (u: Unit) => void }) {
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

// ---------- circles: dowels and stops ----------

interface CircleTablesProps {
  inspection: DxfInspection;
  groups: CircleGroup[];
  roles: CircleRoles;
  dowelOrder: number[];
  fileUnit: Unit | null;
  component: Component;
  plates: PlateHole[];
  onChange: (r: CircleRoles) => void;
}

function CircleTables({ inspection, groups, roles, dowelOrder, fileUnit, component, plates, onChange }: CircleTablesProps) {
  const name = useId();
  if (groups.length === 0) {
    return (
      <section className="flex flex-col gap-1">
        <h3 className="font-semibold">Dowels and stops</h3>
        <p className="text-slate-700">The drawing holds no circles, so no dowel can be picked: its own origin (0, 0) becomes the component's origin.</p>
      </section>
    );
  }
  const circles = inspection.circles;
  const primary = roles.primary !== null ? circles[roles.primary] ?? null : null;
  const dowelSet = new Set(roles.dowels);
  const stopSet = new Set(roles.stops);

  const chooseGroup = (g: CircleGroup | null) =>
    onChange({ dowelKey: g?.key ?? null, dowels: g ? [...g.indices] : [], primary: g?.indices[0] ?? null, stops: roles.stops.filter((i) => !g?.indices.includes(i)) });
  const toggleDowel = (i: number) => {
    if (dowelSet.has(i)) {
      const dowels = roles.dowels.filter((d) => d !== i);
      const order = dowelOrder.filter((d) => d !== i);
      onChange({ ...roles, dowels, primary: roles.primary === i ? order[0] ?? null : roles.primary });
    } else {
      onChange({ ...roles, dowels: [...roles.dowels, i], primary: roles.primary ?? i });
    }
  };
  const makePrimary = (i: number) => onChange({ ...roles, dowels: dowelSet.has(i) ? roles.dowels : [...roles.dowels, i], primary: i });
  const toggleStop = (i: number) => onChange({ ...roles, stops: stopSet.has(i) ? roles.stops.filter((s) => s !== i) : [...roles.stops, i] });

  const local = (i: number): Point | null => (primary && fileUnit ? localPoint(circles[i]!, primary, fileUnit, component.unit) : null);
  const at = (i: number) => `(${formatDrawingCell(circles[i]!.x, fileUnit)}, ${formatDrawingCell(circles[i]!.y, fileUnit)})`;
  const markOf = (i: number) => {
    const d = dowelOrder.indexOf(i);
    if (d >= 0) return d === 0 && i === roles.primary ? 'D1 primary' : `D${d + 1}`;
    const s = roles.stops.indexOf(i);
    return s >= 0 ? `S${s + 1}` : '';
  };

  return (
    <section className="flex flex-col gap-3" aria-labelledby={`${name}-h`}>
      <div>
        <h3 id={`${name}-h`} className="font-semibold">Dowels and stops</h3>
        <p className="text-sm text-slate-600">
          Circles by diameter. Say which size is the locating dowels, tick the dowels and choose the primary one: it becomes the component's origin (0, 0).
          Circles of another size can be ticked as stop positions; this is optional, and stops can be filled in the form afterwards.
        </p>
      </div>
      <div role="radiogroup" aria-label="Which diameter is the locating dowels" className="flex flex-col gap-3">
        {[...groups].sort((a, b) => Number(b.key === roles.dowelKey) - Number(a.key === roles.dowelKey)).map((g) => {
          const matches = platesOfDiameter(g, fileUnit, plates);
          const isDowels = g.key === roles.dowelKey;
          const plate = matches[0];
          const pitch = plate ? convert(plate.pitch, plate.unit, component.unit) : null;
          return (
            <div key={g.key} className={`rounded border ${isDowels ? 'border-accent-700' : 'border-slate-300'}`}>
              <div className="flex flex-wrap items-center gap-x-4 gap-y-1 px-3 py-2">
                <label className="flex min-h-10 cursor-pointer items-center gap-2 font-semibold">
                  <input type="radio" name={`${name}-size`} className="h-5 w-5 accent-accent-700" checked={isDowels} onChange={() => chooseGroup(g)}
                    aria-label={`Circles of ${formatDrawingLength(g.diameter, fileUnit)} diameter are the locating dowels`} />
                  <span>Ø <span className="num">{formatDrawingLength(g.diameter, fileUnit)}</span></span>
                </label>
                <span className="text-slate-700">{g.indices.length} circle{g.indices.length === 1 ? '' : 's'}</span>
                {matches.length ? <span className="text-sm text-slate-700">dowel-hole size of {matches.map((p) => p.code).join(', ')}</span> : null}
                <span className="text-sm text-slate-600">{isDowels ? 'locating dowels' : 'other holes: tick any that are stop positions'}</span>
              </div>
              <div className="overflow-x-auto">
              <table className="w-full border-collapse text-[15px]">
                <caption className="sr-only">Circles of {formatDrawingLength(g.diameter, fileUnit)} diameter</caption>
                <thead className="bg-slate-100 text-sm text-slate-700">
                  <tr className="whitespace-nowrap">
                    <th scope="col" className="px-3 py-1 text-left">Mark</th>
                    <th scope="col" className="px-3 py-1 text-right">X{fileUnit ? '' : ' (unit not known)'}</th>
                    <th scope="col" className="px-3 py-1 text-right">Y{fileUnit ? '' : ' (unit not known)'}</th>
                    <th scope="col" className="px-3 py-1 text-left">Layer</th>
                    <th scope="col" className="px-3 py-1 text-left">{isDowels ? 'Dowel · primary' : 'Stop'}</th>
                    <th scope="col" className="px-3 py-1 text-right">Local X ({component.unit})</th>
                    <th scope="col" className="px-3 py-1 text-right">Local Y ({component.unit})</th>
                    {isDowels && plate ? <th scope="col" className="px-3 py-1 text-left">On the {plate.code} grid</th> : null}
                  </tr>
                </thead>
                <tbody>
                  {g.indices.map((i) => {
                    const c = circles[i]!;
                    const ticked = isDowels ? dowelSet.has(i) : stopSet.has(i);
                    const lp = ticked ? local(i) : null;
                    const grid = isDowels && pitch && lp ? gridOffset(lp, pitch, component.unit) : null;
                    return (
                      <tr key={i} className="border-t border-slate-200" data-testid={`circle-${i}`}>
                        <td className="whitespace-nowrap px-3 font-mono font-semibold text-accent-800">{markOf(i)}</td>
                        <td className="num px-3">{formatDrawingCell(c.x, fileUnit)}</td>
                        <td className="num px-3">{formatDrawingCell(c.y, fileUnit)}</td>
                        <td className="whitespace-nowrap px-3 font-mono text-sm">{c.layer}</td>
                        <td className="px-2">
                          {isDowels ? (
                            <div className="flex items-center gap-1">
                              <label className="flex min-h-10 cursor-pointer items-center gap-2 rounded px-2 hover:bg-slate-100">
                                <input type="checkbox" className="h-5 w-5 accent-accent-700" checked={dowelSet.has(i)} onChange={() => toggleDowel(i)} aria-label={`Dowel at ${at(i)}`} />
                                dowel
                              </label>
                              <label className="flex min-h-10 cursor-pointer items-center gap-2 rounded px-2 hover:bg-slate-100">
                                <input type="radio" name={`${name}-primary`} className="h-5 w-5 accent-accent-700" checked={roles.primary === i} onChange={() => makePrimary(i)} aria-label={`Primary dowel at ${at(i)}`} />
                                primary
                              </label>
                            </div>
                          ) : (
                            <label className="flex min-h-10 cursor-pointer items-center gap-2 rounded px-2 hover:bg-slate-100">
                              <input type="checkbox" className="h-5 w-5 accent-accent-700" checked={stopSet.has(i)} onChange={() => toggleStop(i)} aria-label={`Stop at ${at(i)}`} />
                              stop
                            </label>
                          )}
                        </td>
                        <td className="num px-3">{lp ? formatLength(lp.x, component.unit) : '—'}</td>
                        <td className="num px-3">{lp ? formatLength(lp.y, component.unit) : '—'}</td>
                        {isDowels && plate ? (
                          <td className="px-3 text-sm">
                            {grid ? (grid.on
                              ? <span className="inline-flex items-center gap-1"><CheckCircle2 aria-hidden className="h-4 w-4 text-safe-700" />on the grid</span>
                              : <span className="inline-flex items-center gap-1"><AlertTriangle aria-hidden className="h-4 w-4 text-warning-700" />off by <span className="num">{formatLength(grid.off, component.unit)}</span></span>) : '—'}
                          </td>
                        ) : null}
                      </tr>
                    );
                  })}
                </tbody>
              </table>
              </div>
            </div>
          );
        })}
        <label className="flex min-h-10 w-fit cursor-pointer items-center gap-2 px-3">
          <input type="radio" name={`${name}-size`} className="h-5 w-5 accent-accent-700" checked={roles.dowelKey === null} onChange={() => chooseGroup(null)} />
          None of these circles are dowels (the drawing's origin becomes the component's)
        </label>
      </div>
      {!fileUnit ? <p className="text-sm text-slate-600">Local positions show once the drawing's unit is chosen.</p> : null}
    </section>
  );
}

// ---------- layers ----------

interface LayerMappingProps {
  inspection: DxfInspection;
  mapping: Record<string, string>;
  refusals: Record<string, { target: string; problems: NamingProblem[] }>;
  layerRule?: NamingRule;
  componentLayer: string;
  onChange: (layer: string, value: string) => void;
  onAll: (value: string) => void;
}

function LayerMapping({ inspection, mapping, refusals, layerRule, componentLayer, onChange, onAll }: LayerMappingProps) {
  const id = useId();
  const layers = inspection.layers.filter((l) => l.name in mapping);
  if (layers.length === 0) return null;
  return (
    <section className="flex flex-col gap-2" aria-labelledby={`${id}-h`}>
      <div className="flex flex-wrap items-end justify-between gap-2">
        <div>
          <h3 id={`${id}-h`} className="font-semibold">Layers as stored</h3>
          <p className="text-sm text-slate-600">Each layer of the file takes a name that fits the shop's naming convention. Leave a field empty to keep the file's name.</p>
        </div>
        {componentLayer ? <Button variant="secondary" onClick={() => onAll(componentLayer)}>Put every layer on {componentLayer}</Button> : null}
      </div>
      <div className="overflow-x-auto">
      <table className="w-full border-collapse text-[15px]">
        <caption className="sr-only">File layers and the names they are stored under</caption>
        <thead className="bg-slate-100 text-sm text-slate-700">
          <tr>
            <th scope="col" className="px-3 py-1 text-left">File layer</th>
            <th scope="col" className="px-3 py-1 text-right">Entities</th>
            <th scope="col" className="px-3 py-1 text-left">Stored as</th>
            <th scope="col" className="px-3 py-1 text-left">Naming convention</th>
          </tr>
        </thead>
        <tbody>
          {layers.map((l, row) => {
            const target = targetName(l.name, mapping);
            const refused = refusals[l.name]?.target === target ? refusals[l.name]!.problems : null;
            const check = refused ? { ok: false, problems: refused } : layerRule ? checkName(layerRule, target, 'layer') : target === l.name ? { ok: l.ok, problems: l.problems } : null;
            const msgId = `${id}-check-${row}`; // layer names may hold spaces, which an id list cannot
            return (
              <tr key={l.name} className="border-t border-slate-200 align-top">
                <td className="min-w-40 px-3 py-2">
                  <span className="break-all font-mono">{l.name}</span>
                  {!l.ok ? <p className="text-sm text-slate-600">does not fit{l.proposed ? `; proposed ${l.proposed}` : '; no name proposed'}</p> : null}
                </td>
                <td className="num px-3 py-2">{l.entities}</td>
                <td className="px-3 py-1">
                  <input className={`${inputClass} min-w-44 font-mono`} value={mapping[l.name] ?? ''} placeholder={l.name}
                    onChange={(e) => onChange(l.name, e.target.value)} aria-label={`Conforming name for layer ${l.name}`}
                    aria-invalid={check ? !check.ok : undefined} aria-describedby={msgId} spellCheck={false} autoCapitalize="characters" />
                </td>
                <td id={msgId} className="px-3 py-2 text-sm">
                  {check === null ? (
                    <span className="text-slate-600">checked when the outline is used</span>
                  ) : check.ok ? (
                    <span className="inline-flex items-center gap-1 text-safe-700"><CheckCircle2 aria-hidden className="h-4 w-4" />fits</span>
                  ) : (
                    <div role={refused ? 'alert' : undefined} className="flex flex-col gap-0.5 text-danger-700">
                      <span className="inline-flex items-center gap-1 font-semibold"><AlertTriangle aria-hidden className="h-4 w-4" />{refused ? 'refused: does not fit' : 'does not fit'}</span>
                      {check.problems.map((p, k) => <span key={k}>{p.message}</span>)}
                    </div>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      </div>
    </section>
  );
}

// ---------- after the outline is stored ----------

interface StoredPanelProps {
  component: Component;
  storedWith: StoredWith;
  inspection: DxfInspection;
  save: ReturnType<typeof useSaveComponent>;
  onAnother: () => void;
}

function StoredPanel({ component, storedWith, inspection, save, onAnother }: StoredPanelProps) {
  const { roles, fileUnit, dowelOrder } = storedWith;
  const dowels = roles.primary !== null ? dowelsFromCircles(inspection.circles, roles.primary, dowelOrder, fileUnit, component.unit) : [];
  const stops = roles.primary !== null ? stopsFromCircles(inspection.circles, roles.primary, roles.stops, fileUnit, component.unit) : [];
  const file = component.outlineFile;
  const pt = (p: Point) => `(${formatLength(p.x, component.unit)}, ${formatLength(p.y, component.unit)})`;
  const setDowels = () => save.mutate(componentWith(component, dowels, stops.length ? stops : component.stops));
  return (
    <div className="flex flex-col gap-3">
      <Notice tone="safe" title={`Outline of ${component.code} stored from ${file?.name ?? storedWith.fileName}`}>
        <p>Drawn above under Outline, origin at the primary dowel.</p>
        {file ? <p className="break-all text-sm">SHA-256 <span className="font-mono">{file.sha256}</span></p> : null}
      </Notice>
      {dowels.length ? (
        <div className="flex flex-col gap-2">
          {save.isSuccess ? (
            <Notice tone="safe" title="Dowels set">
              <p>{save.data.dowels.map(pt).join(', ')}{stops.length ? `, and ${stops.length} stop${stops.length === 1 ? '' : 's'} at angle 0°` : ''}.</p>
              <p>{stops.length ? 'Give the stops their angles and jaw faces in the form above.' : 'Stops, if the component has them, can be filled in the form above.'}</p>
            </Notice>
          ) : (
            <>
              <p className="text-slate-800">
                Storing the outline left the component's dowels as they were: {component.dowels.map(pt).join(', ')}.
                The ticked circles give {dowels.map(pt).join(', ')}{stops.length ? ` and ${stops.length} stop${stops.length === 1 ? '' : 's'} at angle 0°` : ''}.
              </p>
              <div>
                <Button variant="secondary" onClick={setDowels} disabled={save.isPending}>
                  {save.isPending ? 'Saving…' : stops.length ? 'Also set the dowels and stops to the ticked circles' : 'Also set the dowels to the ticked circles'}
                </Button>
              </div>
            </>
          )}
          <ErrorText error={save.error} />
        </div>
      ) : null}
      <div>
        <Button variant="ghost" onClick={onAnother}><RotateCcw aria-hidden className="h-4 w-4" />Read another file</Button>
      </div>
    </div>
  );
}
