/**
 * Items of `from` and `to` told apart by a key, counted as a multiset: a key listed twice in
 * `from` and once in `to` leaves one resolved. Two versions can carry the same finding twice
 * (e.g. two hand-list repeats of one station), so plain set difference would hide one.
 *
 * `introduced` keeps `to`'s order, `resolved` keeps `from`'s; the surplus occurrences of a key
 * are the last ones, so swapping the arguments swaps the two lists exactly.
 */
export function keyedDifference<T>(from: readonly T[], to: readonly T[], key: (item: T) => string): { introduced: T[]; resolved: T[] } {
  return { introduced: surplus(to, from, key), resolved: surplus(from, to, key) };
}

function surplus<T>(items: readonly T[], other: readonly T[], key: (item: T) => string): T[] {
  const available = new Map<string, number>();
  for (const item of other) {
    const k = key(item);
    available.set(k, (available.get(k) ?? 0) + 1);
  }
  const out: T[] = [];
  for (const item of items) {
    const k = key(item);
    const left = available.get(k) ?? 0;
    if (left > 0) available.set(k, left - 1);
    else out.push(item);
  }
  return out;
}
