import { RotateCcw } from 'lucide-react';
import type { Point } from '../../../../shared/schemas/common';
import type { Component } from '../../../../shared/schemas/catalog';
import { formatLength } from '../../../../shared/units/units';
import { Button } from '../../../components/ui/button';
import { ErrorText, Notice } from '../../../components/ui/notice';
import type { useSaveComponent } from '../api';
import type { DxfInspection } from '../dxf-inspection';
import type { StoredWith } from '../outline-import-state';
import { dowelsFromCircles, stopsFromCircles, componentWith } from '../outline-preview';

interface StoredPanelProps {
  component: Component;
  storedWith: StoredWith;
  inspection: DxfInspection;
  save: ReturnType<typeof useSaveComponent>;
  onAnother: () => void;
}

/** After the outline is stored: what was stored, and the offer to set the dowels (and stops) to the ticked circles. */
export function StoredPanel({ component, storedWith, inspection, save, onAnother }: StoredPanelProps) {
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
