// Reading ASCII DXF drawings: the public entry point. The work is split by concern under
// server/dxf/read/: tokenizer (group codes), scan (structure, counts), header (units),
// blocks (INSERT expansion), walk and entities-* (entity readers), context (shared state and
// checks), text (TEXT/MTEXT values); bulge, extents, transform and OCS arithmetic live in
// shared/geometry/.
import DxfParser from 'dxf-parser';
import type { IDxf } from 'dxf-parser';
import { Affine } from '../../shared/geometry/transform';
import { LIMITS } from '../../shared/schemas/limits';
import { DxfError } from './dxf-error';
import { planExpansion } from './read/blocks';
import { ReadContext } from './read/context';
import { CHORD_TOLERANCE, readHeader } from './read/header';
import { scanDxf } from './read/scan';
import type { DxfInspection, InspectDxfOptions } from './read/types';
import { readList } from './read/walk';

export { DxfError } from './dxf-error';
export type { DxfErrorCode } from './dxf-error';
export { CHORD_TOLERANCE } from './read/header';
export type { DxfBBox, DxfCircle, DxfInspection, DxfNote, DxfPoint, InspectDxfOptions } from './read/types';

/** Default cap on entities per file, block definitions and block expansion included. */
export const DEFAULT_MAX_ENTITIES = 500_000;

function sortedCounts(map: Map<string, number>, byCount: boolean): { type: string; count: number }[] {
  const list = [...map].filter(([, n]) => n > 0).map(([type, count]) => ({ type, count }));
  return list.sort((a, b) => (byCount && b.count !== a.count ? b.count - a.count : a.type < b.type ? -1 : a.type > b.type ? 1 : 0));
}

/**
 * Reads an ASCII DXF drawing (R12 through current) into Gridset's outline, circles, points and
 * notes, in the drawing's own unit. Blocks are expanded; curves other than arcs become polylines
 * within CHORD_TOLERANCE; entity types Gridset does not read are counted in `unsupported`.
 * Throws DxfError when the file cannot be read, with a message for the user.
 */
export function inspectDxf(text: string, options: InspectDxfOptions = {}): DxfInspection {
  const maxEntities = options.maxEntities ?? DEFAULT_MAX_ENTITIES;
  if (typeof text !== 'string') throw new TypeError('inspectDxf expects the DXF file as a string.');
  // A byte-order mark would hide the first group code from dxf-parser (and with it the HEADER).
  const source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (source.startsWith('AutoCAD Binary DXF')) {
    throw new DxfError('binary', 'This is a binary DXF file; Gridset reads ASCII DXF only. Save the drawing again as ASCII DXF.', { line: 1 });
  }
  if (/^AC10[0-9]{2}/.test(source)) {
    throw new DxfError('not-dxf', 'This looks like a DWG drawing, not a DXF file. Save or export it as ASCII DXF.', { line: 1 });
  }
  if (!/\S/.test(source)) throw new DxfError('empty', 'The file is empty: it holds no DXF data.');

  const scan = scanDxf(source, maxEntities);
  if (scan.entities === null) {
    throw new DxfError('no-entities', 'The drawing has no entities: the file has no ENTITIES section.');
  }
  if (scan.entities.total === 0) {
    throw new DxfError('no-entities', `The drawing has no entities: its ENTITIES section (line ${scan.entities.line}) is empty.`, {
      line: scan.entities.line,
    });
  }

  let parsed: IDxf;
  try {
    parsed = new DxfParser().parse(source) as IDxf;
  } catch (err) {
    const why = err instanceof Error ? err.message : String(err);
    throw new DxfError('malformed', `The DXF file could not be read: ${why.replace(/\.?$/, '.')}`);
  }
  const plan = planExpansion(parsed, scan, maxEntities);

  const { unit, insunits, version, unitWarning } = readHeader(parsed.header);
  // Without a unit, keep to the finer of the two tolerances.
  const tol = CHORD_TOLERANCE[unit ?? 'in'];
  const unitLabel = unit ?? 'drawing units';

  const maxCoord = unit === 'in' ? LIMITS.coordinateMm / 25.4 : LIMITS.coordinateMm;
  const reader = new ReadContext(source, scan, parsed.blocks ?? {}, tol, maxCoord, unitLabel);
  readList(reader, parsed.entities, scan.entities, Affine.IDENTITY, null, 0);

  const unsupported = new Map(plan.unsupported);
  for (const [type, n] of reader.unsupported) unsupported.set(type, (unsupported.get(type) ?? 0) + n);

  const warnings: string[] = [];
  if (unitWarning !== null) warnings.push(unitWarning);
  warnings.push(...reader.warnings());

  const ext = reader.ext;
  return {
    unit,
    insunits,
    version,
    layers: [...reader.layers]
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
      .map(([name, c]) => ({ name, entities: c.n })),
    entities: scan.entities.total,
    entityTypes: sortedCounts(scan.entities.types, false),
    expandedEntities: plan.count,
    bbox: ext.empty ? null : { minX: ext.minX, minY: ext.minY, maxX: ext.maxX, maxY: ext.maxY },
    circles: reader.circles,
    unsupported: sortedCounts(unsupported, true),
    outline: { paths: reader.paths, circles: reader.circles },
    notes: reader.notes,
    points: reader.points,
    approximations: reader.approximations(unitLabel),
    warnings,
  };
}
