import { useMemo, useState } from 'react';
import type { Component } from '../../../shared/schemas/catalog';
import type { Numbering, Placement, SharedOffset, TemplateComponent, TemplateContent } from '../../../shared/schemas/template';
import type { TemplateVersion } from '../../../shared/schemas/template-api';
import { evaluateTemplate } from '../../../shared/stations/evaluate-template';

export interface LayoutDraft {
  placements: Placement[];
  sharedOffset: SharedOffset;
  numbering: Numbering;
}

const copyOf = (c: Component): TemplateComponent => ({
  code: c.code, kind: c.kind, unit: c.unit, name: c.name, dowels: c.dowels, stops: c.stops, jawFaces: c.jawFaces, outline: c.outline, clamp: c.clamp, layer: c.layer,
});

/**
 * The editor's working copy of a version's layout, evaluated live with the same engine the
 * server runs on save, so the drawing and the station table follow every edit before it is saved.
 * Components come from the version's own copies, then from the catalog for newly used codes.
 */
export function useLayoutDraft(version: TemplateVersion, catalog: Component[]) {
  const [draft, setDraft] = useState<LayoutDraft>(() => ({ placements: version.placements, sharedOffset: version.sharedOffset, numbering: version.numbering }));
  const savedJson = useMemo(() => JSON.stringify({ placements: version.placements, sharedOffset: version.sharedOffset, numbering: version.numbering }), [version]);

  const components = useMemo(() => {
    const byCode = new Map<string, TemplateComponent>(version.components.map((c) => [c.code, c]));
    for (const c of catalog) if (!byCode.has(c.code)) byCode.set(c.code, copyOf(c));
    return byCode;
  }, [version.components, catalog]);

  const content: TemplateContent = useMemo(() => {
    const used = [...new Set(draft.placements.map((p) => p.component))].sort();
    return {
      name: version.name, unit: version.unit, plate: version.plate,
      components: used.map((code) => components.get(code)).filter((c): c is TemplateComponent => !!c),
      placements: draft.placements, sharedOffset: draft.sharedOffset, numbering: draft.numbering,
    };
  }, [draft, components, version.name, version.unit, version.plate]);

  const evaluation = useMemo(() => evaluateTemplate(content), [content]);
  const dirty = JSON.stringify(draft) !== savedJson;

  // The editor is keyed by the version's revision, so a save or a reload starts a fresh draft.
  return {
    draft, content, evaluation, dirty, components,
    update: (patch: Partial<LayoutDraft>) => setDraft((d) => ({ ...d, ...patch })),
  };
}
export type LayoutDraftState = ReturnType<typeof useLayoutDraft>;
