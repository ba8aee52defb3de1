// Dragging a placement from hole to hole with pointer events (mouse, pen and touch alike): the
// primary dowel snaps to the grid hole nearest where it is carried, the drawing shows it there,
// and a hole the layout would refuse is said in words and not dropped on.
import { memo, useRef, useState, type PointerEvent, type RefObject } from 'react';
import type { Point } from '../../../../shared/schemas/common';
import type { Hole } from '../../../../shared/schemas/template';
import { placementTransform } from '../../../../shared/geometry/transform';
import { nearestHole, transformAttr } from './plate-drawing-geometry';
import type { Ink } from './plate-drawing-layers';
import type { DrawnPlacement, PlateScene } from './plate-drawing-scene';
import { viewToPlate } from './plate-drawing-view';

/** Pointer travel (px) below which a press is a click, not a drag. */
const DRAG_SLOP = 4;

export interface DragState {
  id: string;
  /** Where the primary dowel would go. */
  hole: Hole;
  rotation: number;
  /** False while it is over the hole it started on. */
  moved: boolean;
  /** Why it cannot go there, in words; null when it can. */
  refusal: string | null;
}

interface Press {
  pointerId: number;
  id: string;
  start: Point;
  from: Hole;
  rotation: number;
  /** Pointer minus primary dowel, in plate units: the grip is kept where it was taken. */
  grip: Point;
  dragging: boolean;
}

/** A client point in plate coordinates, through the zoom group's own screen matrix. */
export function plateAtClient(group: SVGGElement | null, clientX: number, clientY: number): Point | null {
  const m = group?.getScreenCTM();
  if (!m) return null;
  const p = new DOMPoint(clientX, clientY).matrixTransform(m.inverse());
  return viewToPlate({ x: p.x, y: p.y });
}

const sameHole = (a: Hole, b: Hole) => a.col === b.col && a.row === b.row;

export function usePlacementDrag(args: {
  enabled: boolean;
  plate: PlateScene;
  groupRef: RefObject<SVGGElement | null>;
  /** Shared with the zoom: true while a press on a placement owns the pointer. */
  blockRef: RefObject<boolean>;
  checkMove?: (id: string, hole: Hole) => string | null;
  onMove?: (id: string, hole: Hole) => void;
}) {
  const { enabled, plate, groupRef, blockRef, checkMove, onMove } = args;
  const [drag, setDragState] = useState<DragState | null>(null);
  const current = useRef<DragState | null>(null);
  const setDrag = (d: DragState | null) => {
    current.current = d;
    setDragState(d);
  };
  const press = useRef<Press | null>(null);
  /** A drag ends in a click event on the captured element; that click is not a selection. */
  const swallowClick = useRef(false);

  const end = (e: PointerEvent<SVGSVGElement>, drop: boolean) => {
    const p = press.current;
    if (!p || p.pointerId !== e.pointerId) return;
    press.current = null;
    blockRef.current = false;
    if (e.currentTarget.hasPointerCapture?.(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    if (!p.dragging) return;
    swallowClick.current = true;
    const d = current.current;
    setDrag(null);
    if (drop && d && d.moved && !d.refusal) onMove?.(d.id, d.hole);
  };

  const onPointerDown = (e: PointerEvent<SVGSVGElement>) => {
    swallowClick.current = false;
    if (!enabled || !onMove || (e.pointerType === 'mouse' && e.button !== 0)) return;
    if (press.current) {
      // A second finger: this is a pinch, not a drag.
      press.current = null;
      blockRef.current = false;
      setDrag(null);
      return;
    }
    const id = e.target instanceof Element ? e.target.closest('[data-placement]')?.getAttribute('data-placement') : null;
    const placement = id ? plate.byId.get(id) : undefined;
    const at = plateAtClient(groupRef.current, e.clientX, e.clientY);
    if (!placement || !at) return;
    blockRef.current = true;
    try {
      e.currentTarget.setPointerCapture(e.pointerId);
    } catch {
      // A pointer the browser no longer knows (lifted already) cannot be captured; carry on uncaptured.
    }
    press.current = {
      pointerId: e.pointerId, id: placement.id, start: { x: e.clientX, y: e.clientY }, from: placement.hole, rotation: placement.rotation,
      grip: { x: at.x - placement.primary.x, y: at.y - placement.primary.y }, dragging: false,
    };
  };

  const onPointerMove = (e: PointerEvent<SVGSVGElement>) => {
    const p = press.current;
    if (!p || p.pointerId !== e.pointerId) return;
    if (!p.dragging && Math.hypot(e.clientX - p.start.x, e.clientY - p.start.y) <= DRAG_SLOP) return;
    p.dragging = true;
    const at = plateAtClient(groupRef.current, e.clientX, e.clientY);
    if (!at) return;
    const { hole } = nearestHole({ x: at.x - p.grip.x, y: at.y - p.grip.y }, plate);
    const d = current.current;
    if (d && sameHole(d.hole, hole)) return;
    const moved = !sameHole(hole, p.from);
    setDrag({ id: p.id, hole, rotation: p.rotation, moved, refusal: moved ? checkMove?.(p.id, hole) ?? null : null });
  };

  const cancel = () => {
    press.current = null;
    blockRef.current = false;
    setDrag(null);
  };

  return {
    drag,
    /** True once, for the click that ends a drag. */
    takeClick: () => {
      const s = swallowClick.current;
      swallowClick.current = false;
      return s;
    },
    cancel,
    handlers: {
      onPointerDown,
      onPointerMove,
      onPointerUp: (e: PointerEvent<SVGSVGElement>) => end(e, true),
      onPointerCancel: (e: PointerEvent<SVGSVGElement>) => end(e, false),
    },
  };
}

/** The dragged placement drawn where it would land: accent when it may go there, dashed danger when not. */
export const DragGhost = memo(function DragGhost({ drag, placement, pitch, ink }: { drag: DragState | null; placement: DrawnPlacement | null; pitch: number; ink: Ink }) {
  if (!drag || !placement || !drag.moved) return null;
  const t = transformAttr(placementTransform(drag.hole, drag.rotation, pitch));
  return (
    <g aria-hidden="true" pointerEvents="none" transform={t} data-testid="drag-ghost">
      <path d={placement.shape.fill + placement.shape.lines} fillRule="evenodd"
        className={drag.refusal ? `fill-none ${ink.fault}` : ink.selected} strokeWidth={drag.refusal ? 2.5 : 3}
        strokeDasharray={drag.refusal ? '7 4' : undefined} vectorEffect="non-scaling-stroke" />
    </g>
  );
});
