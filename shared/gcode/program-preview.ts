import type { Station } from '../schemas/template';
import { toTable } from './expand-program';
import type { PartProgram, XY } from './read-part-program';

/** What the screen draws of a whole-table program: each station's cutting path and holes, in shared-offset X Y. */
export interface TablePreview {
  stations: { number: number; at: XY; paths: XY[][]; holes: XY[] }[];
  bounds: { minX: number; minY: number; maxX: number; maxY: number } | null;
}

/** Points drawn per station at most: a preview, not a simulation. */
export const PREVIEW_POINTS = 1500;

/** Feed paths (G1, arcs as chords of at most 15°) and canned-cycle holes of the part, in part coordinates. */
function partPaths(program: PartProgram): { paths: XY[][]; holes: XY[] } {
  const paths: XY[][] = [];
  const holes: XY[] = [];
  let current: XY[] | null = null;
  for (const b of program.blocks) {
    if (b.kind === 'cycle') {
      if (b.end) holes.push(b.end);
      current = null;
      continue;
    }
    if (b.kind !== 'move' || !b.hasXY || !b.start || !b.end) continue;
    if (b.motion === 0) { current = null; continue; }
    if (!current) { current = [b.start]; paths.push(current); }
    if ((b.motion === 2 || b.motion === 3) && b.center) {
      const c = b.center;
      const r = Math.hypot(b.start.x - c.x, b.start.y - c.y);
      const a0 = Math.atan2(b.start.y - c.y, b.start.x - c.x);
      let sweep = Math.atan2(b.end.y - c.y, b.end.x - c.x) - a0;
      if (b.motion === 3 && sweep <= 0) sweep += 2 * Math.PI;
      if (b.motion === 2 && sweep >= 0) sweep -= 2 * Math.PI;
      const n = Math.max(1, Math.ceil(Math.abs(sweep) / (Math.PI / 12)));
      for (let k = 1; k < n; k++) current.push({ x: c.x + r * Math.cos(a0 + (sweep * k) / n), y: c.y + r * Math.sin(a0 + (sweep * k) / n) });
    }
    current.push(b.end);
  }
  return { paths, holes };
}

export function tablePreview(program: PartProgram, stations: readonly Station[]): TablePreview {
  const part = partPaths(program);
  const total = part.paths.reduce((n, p) => n + p.length, 0);
  const step = Math.max(1, Math.ceil(total / PREVIEW_POINTS));
  const thinned = part.paths.map((p) => p.filter((_, i) => i % step === 0 || i === p.length - 1));
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const grow = (q: XY) => {
    if (q.x < minX) minX = q.x;
    if (q.x > maxX) maxX = q.x;
    if (q.y < minY) minY = q.y;
    if (q.y > maxY) maxY = q.y;
  };
  const out = stations.map((s) => {
    const paths = thinned.map((p) => p.map((q) => toTable(q, s)));
    const holes = part.holes.slice(0, PREVIEW_POINTS).map((q) => toTable(q, s));
    const at = { x: s.x, y: s.y };
    grow(at);
    paths.forEach((p) => p.forEach(grow));
    holes.forEach(grow);
    return { number: s.number, at, paths, holes };
  });
  return { stations: out, bounds: Number.isFinite(minX) ? { minX, minY, maxX, maxY } : null };
}
