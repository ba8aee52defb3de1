import type { Unit } from '../../../shared/schemas/common';
import type { NamingProblem } from '../../../shared/schemas/naming';
import type { DxfInspection } from './dxf-inspection';
import { initialMapping, outlineLayers, type CircleRoles } from './outline-preview';

/**
 * The outline import screen's state in one place: the file read (its name and size; the server
 * keeps the file itself under its SHA-256, so it is sent once), what the user chose on the preview,
 * and what the store answered. Every change is one action, so the screen's parts change it alike.
 */

/** What was sent when the outline was stored: the dowel offer afterwards must use the same primary. */
export interface StoredWith {
  fileName: string;
  fileUnit: Unit;
  roles: CircleRoles;
  dowelOrder: number[];
}

export type LayerRefusals = Record<string, { target: string; problems: NamingProblem[] }>;

export interface ImportState {
  file: { name: string; size: number } | null;
  inspection: DxfInspection | null;
  /** Upload progress of the inspection, 0–1, while it is sent. */
  progress: number | null;
  chosenUnit: Unit | null;
  unitError: string | null;
  hidden: ReadonlySet<string>;
  /** Until the user changes a tick, the guess follows what is known (plates load, a unit is chosen). */
  rolesOverride: CircleRoles | null;
  /** File layer → the name typed for it. */
  mapping: Record<string, string>;
  refusals: LayerRefusals;
  storedWith: StoredWith | null;
}

export const emptyImport: ImportState = {
  file: null, inspection: null, progress: null, chosenUnit: null, unitError: null, hidden: new Set(), rolesOverride: null, mapping: {}, refusals: {}, storedWith: null,
};

export type ImportAction =
  | { type: 'picked'; file: { name: string; size: number } }
  | { type: 'progress'; value: number | null }
  | { type: 'inspected'; inspection: DxfInspection }
  | { type: 'choose-unit'; unit: Unit }
  | { type: 'unit-error'; message: string }
  | { type: 'toggle-layer'; layer: string }
  | { type: 'roles'; roles: CircleRoles }
  | { type: 'map-layer'; layer: string; value: string }
  | { type: 'map-all'; value: string }
  | { type: 'refused'; refusals: LayerRefusals }
  | { type: 'stored'; storedWith: StoredWith }
  | { type: 'reset' };

function toggled(set: ReadonlySet<string>, key: string): Set<string> {
  const next = new Set(set);
  if (next.has(key)) next.delete(key);
  else next.add(key);
  return next;
}

export function importReducer(s: ImportState, a: ImportAction): ImportState {
  switch (a.type) {
    case 'picked': return { ...emptyImport, file: a.file };
    case 'progress': return { ...s, progress: a.value };
    case 'inspected': return { ...s, inspection: a.inspection, progress: null, mapping: initialMapping(a.inspection.layers.filter((l) => outlineLayers(a.inspection.outline).has(l.name))) };
    case 'choose-unit': return { ...s, chosenUnit: a.unit, unitError: null, rolesOverride: null };
    case 'unit-error': return { ...s, unitError: a.message };
    case 'toggle-layer': return { ...s, hidden: toggled(s.hidden, a.layer) };
    case 'roles': return { ...s, rolesOverride: a.roles };
    case 'map-layer': return { ...s, mapping: { ...s.mapping, [a.layer]: a.value } };
    case 'map-all': return { ...s, mapping: Object.fromEntries(Object.keys(s.mapping).map((k) => [k, a.value])) };
    case 'refused': return { ...s, refusals: a.refusals };
    case 'stored': return { ...s, refusals: {}, storedWith: a.storedWith };
    case 'reset': return emptyImport;
  }
}
