import type { VersionDiff } from '../schemas/diff';
import { formatNumber } from '../units/units';

const count = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** True when nothing a reviewer signs off on differs; the unchanged-station count is not a change. */
export function isNoChange(d: Omit<VersionDiff, 'summary'>): boolean {
  const { template, plate, components, placements, stations, sharedOffset, problems, naming } = d;
  return !template.name.changed && !template.unit.changed && !template.numbering.changed && !plate.changed
    && !sharedOffset.changed
    && [components.added, components.removed, components.changed].every((l) => l.length === 0)
    && [placements.added, placements.removed, placements.moved, placements.changed].every((l) => l.length === 0)
    && [stations.added, stations.removed, stations.changed, stations.renumbered, stations.widthChanged].every((l) => l.length === 0)
    && [problems.introduced, problems.resolved, naming.introduced, naming.resolved].every((l) => l.length === 0);
}

/**
 * One sentence for the review list. The placement, station and shared offset clauses are always
 * there so lines of different comparisons read alike; the others appear only when they apply.
 */
export function summaryText(d: Omit<VersionDiff, 'summary'>): string {
  if (isNoChange(d)) return 'No changes.';
  const { unit, template, plate, components, placements: p, stations: s, sharedOffset: so, problems, naming } = d;
  const clauses = [
    `${count(p.moved.length, 'placement')} moved, ${p.added.length} added, ${p.removed.length} removed`,
    `${count(s.changed.length, 'station')} changed, ${s.added.length} added, ${s.removed.length} removed, ${s.renumbered.length} renumbered`,
    so.moved
      ? `shared offset moved by (${formatNumber(so.dx, unit)}, ${formatNumber(so.dy, unit)}, ${formatNumber(so.dz, unit)}) ${unit}`
      : so.changed ? 'shared offset redefined on the same origin' : 'shared offset unchanged',
  ];
  if (p.changed.length) clauses.push(`${count(p.changed.length, 'placement')} with another component or other stops in use`);
  if (s.widthChanged.length) clauses.push(`nominal width changed at ${count(s.widthChanged.length, 'station')}`);
  if (plate.changed) clauses.push(`plate changed (${plate.fields.join(', ')})`);
  if (template.unit.changed) clauses.push(`unit changed from ${template.unit.from} to ${template.unit.to}`);
  if (template.numbering.changed) {
    const { from, to } = template.numbering;
    clauses.push(from.order === to.order ? 'hand numbering list changed' : `numbering changed from ${from.order} to ${to.order}`);
  }
  if (template.name.changed) clauses.push('template renamed');
  if (components.added.length || components.removed.length || components.changed.length) {
    clauses.push(`${count(components.changed.length, 'component definition')} changed, ${components.added.length} added, ${components.removed.length} removed`);
  }
  if (problems.introduced.length || problems.resolved.length) {
    clauses.push(`${count(problems.introduced.length, 'layout problem')} introduced, ${problems.resolved.length} resolved`);
  }
  if (naming.introduced.length || naming.resolved.length) {
    clauses.push(`${count(naming.introduced.length, 'naming problem')} introduced, ${naming.resolved.length} resolved`);
  }
  return `${clauses.join('; ')}.`;
}
