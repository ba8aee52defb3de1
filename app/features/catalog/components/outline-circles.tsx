import { useId } from 'react';
import { AlertTriangle, CheckCircle2 } from 'lucide-react';
import type { Point, Unit } from '../../../../shared/schemas/common';
import type { Component } from '../../../../shared/schemas/catalog';
import { convert, formatLength } from '../../../../shared/units/units';
import type { DxfInspection } from '../dxf-inspection';
import { formatDrawingCell, formatDrawingLength, gridOffset, localPoint, platesOfDiameter, type CircleGroup, type CircleRoles, type PlateHole } from '../outline-preview';
import type { CircleMark } from './outline-drawing';

/** The component's dowel order: the primary first, then the other ticked dowels left to right. */
export function dowelOrderOf(roles: CircleRoles, group: CircleGroup | null): number[] {
  const ticked = new Set(roles.dowels);
  const rest = (group?.indices ?? []).filter((i) => ticked.has(i) && i !== roles.primary);
  return roles.primary !== null ? [roles.primary, ...rest] : rest;
}

/** The marks the preview draws on the ticked circles. */
export function marksOf(roles: CircleRoles, dowelOrder: number[]): CircleMark[] {
  return [
    ...dowelOrder.map((index, n): CircleMark => ({ index, kind: n === 0 && index === roles.primary ? 'primary' : 'dowel', label: n === 0 && index === roles.primary ? 'D1 primary' : `D${n + 1}` })),
    ...roles.stops.map((index, n): CircleMark => ({ index, kind: 'stop', label: `S${n + 1}` })),
  ];
}

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

/** Circles by diameter: which size is the locating dowels, which dowel is the primary (the origin), which other holes are stops. */
export function CircleTables({ inspection, groups, roles, dowelOrder, fileUnit, component, plates, onChange }: CircleTablesProps) {
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
