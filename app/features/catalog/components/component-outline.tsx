import { useMemo } from 'react';
import type { Component } from '../../../../shared/schemas/catalog';
import { componentOutlineFileUrl } from '../api';
import { dowelCircles } from '../outline-preview';
import { OutlineDrawing, type CircleMark } from './outline-drawing';

/** The outline a component has now, its dowels marked, and the file it was read from. */
export function ComponentOutline({ component }: { component: Component }) {
  const { outline, outlineFile, unit, dowels } = component;
  const marks = useMemo<CircleMark[]>(
    () => (outline ? dowelCircles(outline, dowels, unit).map((m) => ({ index: m.index, kind: m.dowel === 0 ? 'primary' : 'dowel', label: m.dowel === 0 ? 'D1 (0, 0)' : `D${m.dowel + 1}` })) : []),
    [outline, dowels, unit],
  );
  return (
    <section aria-labelledby="current-outline" className="flex max-w-6xl flex-col gap-2">
      <h2 id="current-outline" className="text-lg font-semibold">Outline</h2>
      {outline ? (
        <>
          <OutlineDrawing outline={outline} title={`Outline of ${component.code}, seen from above, origin at the primary dowel`} marks={marks} origin />
          <p className="text-sm text-slate-700">
            {outline.paths.length} path{outline.paths.length === 1 ? '' : 's'} and {outline.circles.length} circle{outline.circles.length === 1 ? '' : 's'} in {unit}, origin at the primary dowel.
          </p>
          {outlineFile ? (
            <dl className="grid w-fit grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="outline-file">
              <dt className="font-semibold text-slate-700">Read from</dt>
              <dd>{outlineFile.name} <span className="text-slate-600">({(outlineFile.size / 1024).toFixed(1)} KiB, drawn in {outlineFile.unit})</span>{' '}
                <a href={componentOutlineFileUrl(component.id)} download className="font-semibold text-accent-700 underline">Download the file</a></dd>
              <dt className="font-semibold text-slate-700">SHA-256</dt>
              <dd className="break-all font-mono">{outlineFile.sha256}</dd>
            </dl>
          ) : (
            <p className="text-sm text-slate-600">Entered by hand, not read from a file.</p>
          )}
        </>
      ) : (
        <p className="text-slate-600">No outline yet: templates draw this component as a box around its dowels.</p>
      )}
    </section>
  );
}
