import type { Numbering, Problem } from '../schemas/template';

/** What numbering needs of a station: its identity, where it sits, and its place in the placement list. */
export interface Numberable {
  id: string;
  x: number;
  y: number;
  /** Position in placement-list order, then stop index: the by-rail order and every tie-breaker. */
  sequence: number;
}

/**
 * Rows by Y, bottom (the datum row) first; a row is a band `rowTolerance` tall starting at its
 * lowest station, so stops on rails pinned in one grid row share a row even when their heights
 * differ a little. Within a row, X ascending.
 */
function rows<T extends Numberable>(items: readonly T[], rowTolerance: number): T[][] {
  const byY = [...items].sort((a, b) => a.y - b.y || a.x - b.x || a.sequence - b.sequence);
  const out: T[][] = [];
  let current: T[] = [];
  let rowStart = -Infinity;
  for (const item of byY) {
    if (item.y - rowStart > rowTolerance) {
      if (current.length) out.push(current);
      current = [];
      rowStart = item.y;
    }
    current.push(item);
  }
  if (current.length) out.push(current);
  for (const row of out) row.sort((a, b) => a.x - b.x || a.sequence - b.sequence);
  return out;
}

export function rowByRow<T extends Numberable>(items: readonly T[], rowTolerance: number): T[] {
  return rows(items, rowTolerance).flat();
}

/** Like row by row, with every second row run right to left so the tool does not rapid back across the plate. */
export function serpentine<T extends Numberable>(items: readonly T[], rowTolerance: number): T[] {
  return rows(items, rowTolerance).flatMap((row, i) => (i % 2 === 0 ? row : [...row].reverse()));
}

export function byRail<T extends Numberable>(items: readonly T[]): T[] {
  return [...items].sort((a, b) => a.sequence - b.sequence);
}

/**
 * The manual list first, in its order; stations it leaves out follow in row-by-row order, so a
 * station added later gets a number instead of vanishing. Unknown and repeated ids are reported.
 */
export function byHand<T extends Numberable>(items: readonly T[], manual: readonly string[], rowTolerance: number): { ordered: T[]; problems: Problem[] } {
  const byId = new Map(items.map((s) => [s.id, s]));
  const taken = new Set<string>();
  const ordered: T[] = [];
  const problems: Problem[] = [];
  for (const id of manual) {
    const item = byId.get(id);
    if (!item) {
      problems.push({ code: 'numbering-unknown-station', station: id, message: `The hand numbering lists station ${id}, which the template does not have.` });
    } else if (taken.has(id)) {
      problems.push({ code: 'numbering-duplicate-station', station: id, message: `The hand numbering lists station ${id} more than once; its first place is kept.` });
    } else {
      taken.add(id);
      ordered.push(item);
    }
  }
  ordered.push(...rowByRow(items.filter((s) => !taken.has(s.id)), rowTolerance));
  return { ordered, problems };
}

/** Stations in numbering order (number = index + 1), with any problems of a hand list. */
export function orderStations<T extends Numberable>(items: readonly T[], numbering: Numbering, rowTolerance: number): { ordered: T[]; problems: Problem[] } {
  switch (numbering.order) {
    case 'row-by-row':
      return { ordered: rowByRow(items, rowTolerance), problems: [] };
    case 'serpentine':
      return { ordered: serpentine(items, rowTolerance), problems: [] };
    case 'by-rail':
      return { ordered: byRail(items), problems: [] };
    case 'by-hand':
      return byHand(items, numbering.manual ?? [], rowTolerance);
  }
}
