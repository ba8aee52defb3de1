import type { TemplateComponent } from '../schemas/template';

/**
 * The layers of a template drawing that are not a component's own. Named so the demo
 * convention's GRID-{what} pattern covers them; a shop whose convention differs renames them by
 * changing its convention, not the code.
 */
export const DRAWING_LAYERS = {
  plate: 'GRID-PLATE',
  holes: 'GRID-HOLES',
  origin: 'GRID-ORIGIN',
  stations: 'GRID-STATIONS',
  numbers: 'GRID-NUMBERS',
  /** The draft mark of a version that is not released (shared/interchange/draft-mark.ts). */
  draft: 'GRID-DRAFT',
} as const;

/** A component's outline goes on its catalog layer, or on one named after its code when it has none. */
export function componentLayer(c: Pick<TemplateComponent, 'code' | 'layer'>): string {
  return c.layer && c.layer.trim() ? c.layer.trim() : `FX-${c.code}`.toUpperCase().replace(/[^A-Z0-9$_-]/g, '-');
}
