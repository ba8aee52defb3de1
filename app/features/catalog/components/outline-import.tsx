import { useId, useMemo, useReducer } from 'react';
import type { Component } from '../../../../shared/schemas/catalog';
import type { NamingRule } from '../../../../shared/schemas/naming';
import { Button } from '../../../components/ui/button';
import { FilePicker } from '../../../components/ui/file-picker';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { usePlates, useSaveComponent } from '../api';
import { useStoreInspectedOutline } from '../outline-api';
import { useInspectDxf } from '../../../lib/dxf-inspection';
import { emptyImport, importReducer, type StoredWith } from '../outline-import-state';
import { defaultRoles, groupCircles, layerMapFor, namingProblemsByFileLayer, progressText, targetName, type PlateHole } from '../outline-preview';
import { CircleTables, dowelOrderOf, marksOf } from './outline-circles';
import { OutlineDrawing } from './outline-drawing';
import { FileFacts, UnitLine } from './outline-file-facts';
import { LayerMapping } from './outline-layers';
import { StoredPanel } from './outline-stored';

/**
 * "Outline from a drawing": read a DXF (nothing stored in the catalog), look at it, say which
 * circles are the locating dowels and which one is the primary (it becomes the local origin), give
 * every layer a conforming name, then store the outline; afterwards, optionally set the dowels too.
 * The file is sent once, to be read: the server keeps it an hour under its SHA-256, and storing the
 * outline names that hash with the choices made here.
 */
export function OutlineImport({ component, layerRule }: { component: Component; layerRule?: NamingRule }) {
  const inspect = useInspectDxf();
  const store = useStoreInspectedOutline(component.id);
  const saveDowels = useSaveComponent(component.id);
  const plates = usePlates();
  const [state, dispatch] = useReducer(importReducer, emptyImport);
  const unitGroup = useId();

  const { file, inspection, chosenUnit, mapping } = state;
  const fileUnit = inspection?.unit ?? chosenUnit;
  const plateHoles = useMemo<PlateHole[]>(() => (plates.data?.items ?? []).map((p) => ({ code: p.code, unit: p.unit, holeDiameter: p.holeDiameter, pitch: p.pitch })), [plates.data]);
  const groups = useMemo(() => (inspection ? groupCircles(inspection.circles, fileUnit) : []), [inspection, fileUnit]);
  const roles = state.rolesOverride ?? defaultRoles(groups, fileUnit, plateHoles);
  const dowelGroup = groups.find((g) => g.key === roles.dowelKey) ?? null;
  const dowelOrder = dowelOrderOf(roles, dowelGroup);
  const stored = state.storedWith ? store.data ?? null : null;

  function startOver() {
    dispatch({ type: 'reset' });
    inspect.reset();
    store.reset();
    saveDowels.reset();
  }

  function pick(f: File) {
    startOver();
    dispatch({ type: 'picked', file: { name: f.name, size: f.size } });
    inspect.mutate(
      { file: f, onProgress: (value) => dispatch({ type: 'progress', value }) },
      { onSuccess: (inspection) => dispatch({ type: 'inspected', inspection }), onSettled: () => dispatch({ type: 'progress', value: null }) },
    );
  }

  function use() {
    if (!file || !inspection) return;
    if (!fileUnit) {
      dispatch({ type: 'unit-error', message: 'Choose the unit the drawing is in: the file does not say.' });
      return;
    }
    const primary = roles.primary !== null ? inspection.circles[roles.primary] ?? null : null;
    const snapshot: StoredWith = { fileName: file.name, fileUnit, roles, dowelOrder };
    const layerMap = layerMapFor(mapping);
    store.mutate(
      {
        sha256: inspection.sha256, name: file.name,
        ...(inspection.unit ? {} : { unit: fileUnit }),
        // The datum travels as JSON numbers, which read back to the same doubles: it arrives exact.
        ...(primary ? { datumX: primary.x, datumY: primary.y } : {}),
        ...(Object.keys(layerMap).length ? { layerMap } : {}),
      },
      {
        onSuccess: () => dispatch({ type: 'stored', storedWith: snapshot }),
        onError: (err) => {
          if (!(err instanceof ApiError)) return;
          if (err.code === 'naming') {
            const byLayer = namingProblemsByFileLayer(err.details, mapping, Object.keys(mapping));
            if (byLayer) dispatch({ type: 'refused', refusals: Object.fromEntries(Object.entries(byLayer).map(([l, problems]) => [l, { target: targetName(l, mapping), problems }])) });
          }
          if (err.code === 'dxf-unit-unknown') dispatch({ type: 'unit-error', message: err.message });
        },
      },
    );
  }

  const storeError = store.error instanceof ApiError ? store.error : null;
  return (
    <section aria-labelledby="outline-import" className="flex max-w-6xl flex-col gap-4 rounded border border-slate-300 bg-white p-4">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id="outline-import" className="text-lg font-semibold">Outline from a drawing</h2>
          <p className="text-sm text-slate-600">Read a DXF of {component.code}: nothing is stored until you use the outline.</p>
        </div>
        <FilePicker label="Choose a DXF file" hideLabel variant="primary" accept=".dxf,.DXF,application/dxf,image/vnd.dxf" onFile={pick}
          buttonLabel={file ? 'Choose another DXF file' : 'Choose a DXF file'} chosen={file?.name ?? null} />
      </div>

      {file ? (
        <p className="text-slate-800">
          <span className="num inline-block text-slate-600">{(file.size / 1024).toFixed(1)} KiB</span>
          {inspect.isPending ? <span role="status" className="ml-3 text-slate-700">{progressText(state.progress, 'Reading the drawing…')}</span> : null}
        </p>
      ) : null}
      {file ? <ErrorText error={inspect.error} /> : null}

      {inspection && file && !stored ? (
        <>
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_19rem]">
            <div className="flex flex-col gap-2">
              <OutlineDrawing outline={inspection.outline} title={`Preview of ${file.name}, seen from above`} hiddenLayers={state.hidden} marks={marksOf(roles, dowelOrder)} />
              <p className="text-sm text-slate-600">Seen from above: +X to the right, +Y up. Ticked dowels are drawn bold, the primary with a cross; stops dashed.</p>
            </div>
            <FileFacts inspection={inspection} unit={fileUnit} hidden={state.hidden} onToggle={(layer) => dispatch({ type: 'toggle-layer', layer })} />
          </div>

          <UnitLine inspection={inspection} componentUnit={component.unit} chosen={chosenUnit} error={state.unitError} groupName={unitGroup}
            onChoose={(unit) => dispatch({ type: 'choose-unit', unit })} />

          <CircleTables inspection={inspection} groups={groups} roles={roles} dowelOrder={dowelOrder} fileUnit={fileUnit} component={component} plates={plateHoles}
            onChange={(next) => dispatch({ type: 'roles', roles: next })} />

          <LayerMapping inspection={inspection} mapping={mapping} refusals={state.refusals} layerRule={layerRule} componentLayer={component.layer}
            onChange={(layer, value) => dispatch({ type: 'map-layer', layer, value })}
            onAll={(value) => dispatch({ type: 'map-all', value })} />

          <div className="flex flex-col gap-2">
            {roles.primary === null ? (
              <Notice tone="caution" title="No primary dowel is chosen">The drawing's own origin (0, 0) becomes the component's local origin. Tick a dowel circle above to put the origin on it.</Notice>
            ) : null}
            {store.error && !(storeError && (storeError.code === 'naming' || storeError.code === 'dxf-unit-unknown')) ? <ErrorText error={store.error} /> : null}
            {storeError?.code === 'naming' ? (
              <Notice tone="danger" title="Some layers do not fit the naming convention">Give them conforming names in the layer table above; each refused layer says why.</Notice>
            ) : null}
            <div className="flex flex-wrap items-center gap-3">
              <Button onClick={use} disabled={store.isPending}>{store.isPending ? 'Storing…' : 'Use this outline'}</Button>
              {store.isPending ? <span role="status" className="text-slate-700">Storing the outline…</span> : null}
              <span className="text-sm text-slate-600">Replaces the outline of {component.code}; dowels and stops stay as they are until you set them.</span>
            </div>
          </div>
        </>
      ) : null}

      {stored && state.storedWith && inspection ? (
        <StoredPanel component={stored} storedWith={state.storedWith} inspection={inspection} save={saveDowels} onAnother={startOver} />
      ) : null}
    </section>
  );
}
