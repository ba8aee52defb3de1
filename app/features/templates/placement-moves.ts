// Whether a placement may go to a hole: the same engine the server runs on save decides, so a
// drag can refuse a hole before the drop, in the words the drawing uses for problems.
import type { Hole, ProblemCode, TemplateContent } from '../../../shared/schemas/template';
import { evaluateTemplate } from '../../../shared/stations/evaluate-template';
import { problemWords } from './components/plate-drawing-scene';

/** Where a placement sits: these stop a save, so a drag or a nudge never lands on them. */
const SITING: ReadonlySet<ProblemCode> = new Set<ProblemCode>(['off-plate', 'dowel-off-plate', 'dowel-off-grid', 'hole-taken', 'overlap']);

/**
 * Why placement `id` cannot have its primary dowel on `hole`, as one sentence, or null when it
 * can. The problems of the layout with the placement moved are read for the ones that name it,
 * either as the placement at fault or as the other one (the engine names the later of two).
 */
export function moveRefusal(content: TemplateContent, id: string, hole: Hole): string | null {
  const placements = content.placements.map((p) => (p.id === id ? { ...p, hole } : p));
  if (!placements.some((p) => p.id === id)) return null;
  const problems = evaluateTemplate({ ...content, placements }).problems;
  const words: string[] = [];
  for (const p of problems) {
    if (!SITING.has(p.code)) continue;
    let word: string | null = null;
    if (p.placement === id) {
      word = p.code === 'overlap' ? `overlaps ${p.otherPlacement}` : p.code === 'hole-taken' ? `a dowel hole is taken by ${p.otherPlacement}` : problemWords(p.code);
    } else if (p.otherPlacement === id) {
      word = p.code === 'overlap' ? `overlaps ${p.placement}` : `a dowel hole is taken by ${p.placement}`;
    }
    if (word && !words.includes(word)) words.push(word);
  }
  return words.length ? `${id} cannot go on hole (${hole.col}, ${hole.row}): ${words.join(', ')}.` : null;
}
