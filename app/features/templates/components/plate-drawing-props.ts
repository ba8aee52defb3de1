// What the plate drawing is given: the template, its stations, and what the caller lets the user do.
import type { Unit } from '../../../../shared/schemas/common';
import type { Hole, Station, TemplateContent } from '../../../../shared/schemas/template';
import type { FaultInput } from './plate-drawing-scene';

/** The shared offset origin in plate coordinates, in the template's unit, as evaluateTemplate returns it. */
export interface PlateDrawingOrigin {
  x: number;
  y: number;
  z: number;
}

/** An older version drawn faint and dashed beneath, for comparing versions. */
export interface PlateDrawingOverlay {
  content: TemplateContent;
  stations: Station[];
  origin: PlateDrawingOrigin;
  /** How the legend names it, e.g. "version 3". */
  label?: string;
}

export interface PlateDrawingProps {
  content: TemplateContent;
  /** From evaluateTemplate: translations from the shared offset, in content.unit. Pass a stable (memoized) array. */
  stations: Station[];
  /** From evaluateTemplate: the shared offset origin in plate coordinates, in content.unit. */
  origin: PlateDrawingOrigin;
  /** Unit of the pointer readout and of the words; the geometry stays in the plate's unit. */
  displayUnit: Unit;
  selectedPlacement?: string | null;
  /** A component (or one of its stations) was clicked; null when empty space away from the grid was clicked, or Escape pressed. */
  onSelectPlacement?: (id: string | null) => void;
  /** Empty plate was clicked within half a pitch of a grid hole. */
  onHoleClick?: (hole: Hole) => void;
  /**
   * A placement was dragged (or nudged with an arrow key) to a hole its primary dowel may go to.
   * Without it placements cannot be dragged.
   */
  onMovePlacement?: (id: string, hole: Hole) => void;
  /** Why a placement cannot go to a hole, in words, or null when it can: asked as a drag passes each hole. */
  checkMove?: (id: string, hole: Hole) => string | null;
  /** The R key on the drawing turns the selected placement a quarter turn. */
  onRotatePlacement?: (id: string) => void;
  /** Draw the machining order as a thin path through the station datums in number order. */
  showOrder?: boolean;
  overlay?: PlateDrawingOverlay;
  /** How the legend names this version when there is an overlay, e.g. "version 4". */
  label?: string;
  /**
   * Placements at fault, drawn with a dashed outline and labelled in words: evaluateTemplate's
   * problems as they are (their codes give the words, their messages the titles), or bare placement ids.
   */
  problems?: readonly (FaultInput | string)[];
  /** For setup sheets: no buttons or readout, black strokes on white, fitted to the page width. */
  printMode?: boolean;
  /** Height of the drawing area on screen (CSS length). */
  height?: string;
  className?: string;
}
