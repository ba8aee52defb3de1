import { useCallback, useMemo, useReducer } from 'react';
import type { Component } from '../../../shared/schemas/catalog';
import type { Hole, Numbering, Placement, Rotation, SharedOffset, TemplateComponent, TemplateContent } from '../../../shared/schemas/template';
import type { TemplateVersion } from '../../../shared/schemas/template-api';
import { evaluateTemplate } from '../../../shared/stations/evaluate-template';
import { historyReducer, startHistory, type History, type HistoryAction } from './layout-history';
import { moveRefusal } from './placement-moves';

export interface LayoutDraft {
  placements: Placement[];
  sharedOffset: SharedOffset;
  numbering: Numbering;
}

const copyOf = (c: Component): TemplateComponent => ({
  code: c.code, kind: c.kind, unit: c.unit, name: c.name, dowels: c.dowels, stops: c.stops, jawFaces: c.jawFaces, outline: c.outline, clamp: c.clamp, layer: c.layer,
});

const draftReducer = (h: History<LayoutDraft>, a: HistoryAction<LayoutDraft>) => historyReducer(h, a);

/**
 * The editor's working copy of a version's layout, evaluated live with the same engine the
 * server runs on save, so the drawing and the station table follow every edit before it is saved.
 * Components come from the version's own copies, then from the catalog for newly used codes.
 * Every edit goes through one history, so each can be undone and redone.
 */
export function useLayoutDraft(version: TemplateVersion, catalog: Component[]) {
  const [history, dispatch] = useReducer(draftReducer, version, (v) =>
    startHistory<LayoutDraft>({ placements: v.placements, sharedOffset: v.sharedOffset, numbering: v.numbering }));
  const draft = history.present;
  const savedJson = useMemo(() => JSON.stringify({ placements: version.placements, sharedOffset: version.sharedOffset, numbering: version.numbering }), [version]);

  const components = useMemo(() => {
    const byCode = new Map<string, TemplateComponent>(version.components.map((c) => [c.code, c]));
    for (const c of catalog) if (!byCode.has(c.code)) byCode.set(c.code, copyOf(c));
    return byCode;
  }, [version.components, catalog]);

  const contentOf = useCallback((d: LayoutDraft): TemplateContent => {
    const used = [...new Set(d.placements.map((p) => p.component))].sort();
    return {
      name: version.name, unit: version.unit, plate: version.plate,
      components: used.map((code) => components.get(code)).filter((c): c is TemplateComponent => !!c),
      placements: d.placements, sharedOffset: d.sharedOffset, numbering: d.numbering,
    };
  }, [components, version.name, version.unit, version.plate]);
  const content = useMemo(() => contentOf(draft), [contentOf, draft]);

  const evaluation = useMemo(() => evaluateTemplate(content), [content]);
  const dirty = JSON.stringify(draft) !== savedJson;

  /** One placement changed by `change`; a no-op when it is not there. */
  const editPlacement = useCallback((id: string, change: (p: Placement) => Placement) => dispatch({
    type: 'edit',
    next: (d) => {
      const placements = d.placements.map((p) => (p.id === id ? change(p) : p));
      return placements.every((p, i) => p === d.placements[i]) ? d : { ...d, placements };
    },
  }), []);

  const undo = useCallback(() => dispatch({ type: 'undo' }), []);
  const redo = useCallback(() => dispatch({ type: 'redo' }), []);

  // The editor is keyed by the version's revision, so a save or a reload starts a fresh draft and history.
  return {
    draft, content, evaluation, dirty, components,
    /** An edit; edits sharing a tag in a row (typing in one field) undo as one step. */
    update: (patch: Partial<LayoutDraft>, tag?: string) => dispatch({ type: 'edit', next: (d) => ({ ...d, ...patch }), ...(tag === undefined ? {} : { tag }) }),
    movePlacement: (id: string, hole: Hole) => editPlacement(id, (p) => (p.hole.col === hole.col && p.hole.row === hole.row ? p : { ...p, hole })),
    rotatePlacement: (id: string) => editPlacement(id, (p) => ({ ...p, rotation: ((p.rotation + 90) % 360) as Rotation })),
    /** Why the placement cannot go to that hole, in words, or null when it can. */
    refusal: (id: string, hole: Hole) => moveRefusal(contentOf(draft), id, hole),
    undo,
    redo,
    canUndo: history.past.length > 0,
    canRedo: history.future.length > 0,
  };
}
export type LayoutDraftState = ReturnType<typeof useLayoutDraft>;
