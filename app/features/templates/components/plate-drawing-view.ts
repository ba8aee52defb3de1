// The drawing's viewBox and how pointer gestures change it. Pure, so the zoom and pan math is
// tested without a browser.
//
// View coordinates are the root SVG's user space: x to the right, y down the screen. A plate
// point (x, y) is drawn at (x, −y) because machine +Y points away from the operator, up on
// the screen (ISO 841, seen from above).
import type { Point } from '../../../../shared/schemas/common';
import type { Box } from './plate-drawing-geometry';

export interface ViewBox {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where the SVG element sits on the screen, as getBoundingClientRect gives it. */
export interface Viewport {
  left: number;
  top: number;
  width: number;
  height: number;
}

export const plateToView = (p: Point): Point => ({ x: p.x, y: p.y === 0 ? 0 : -p.y });
export const viewToPlate = (p: Point): Point => ({ x: p.x, y: p.y === 0 ? 0 : -p.y });

/** A plate-coordinate box as the view box that shows exactly it (its top edge is max Y). */
export function plateBoxToView(b: Box): ViewBox {
  return { x: b.minX, y: -b.maxY, w: b.maxX - b.minX, h: b.maxY - b.minY };
}

/** The plate region a view box spans (the inverse of plateBoxToView). */
export function viewToPlateBox(v: ViewBox): Box {
  return { minX: v.x, minY: -(v.y + v.h), maxX: v.x + v.w, maxY: -v.y };
}

/** The view that shows the box with `pad` to spare on every side; never empty. */
export function fitView(b: Box, pad: number): ViewBox {
  const v = plateBoxToView({ minX: b.minX - pad, minY: b.minY - pad, maxX: b.maxX + pad, maxY: b.maxY + pad });
  return { x: v.x, y: v.y, w: Math.max(v.w, 1e-6), h: Math.max(v.h, 1e-6) };
}

export function viewBoxAttr(v: ViewBox): string {
  return `${v.x} ${v.y} ${v.w} ${v.h}`;
}

/**
 * Screen pixels per view unit under preserveAspectRatio="xMidYMid meet", the default: the
 * view box is scaled uniformly to fit inside the element (SVG 2, "preserveAspectRatio").
 */
export function viewScale(view: ViewBox, vp: Pick<Viewport, 'width' | 'height'>): number {
  return Math.min(vp.width / view.w, vp.height / view.h);
}

/**
 * A client (screen) point in view coordinates, under xMidYMid meet: the scaled view box is
 * centered in the element, so the spare space is split evenly on both sides. Computed from the
 * view we hold rather than from getScreenCTM(), which lags a render behind during a gesture.
 */
export function clientToView(view: ViewBox, vp: Viewport, clientX: number, clientY: number): Point {
  const s = viewScale(view, vp);
  const offX = (vp.width - view.w * s) / 2;
  const offY = (vp.height - view.h * s) / 2;
  return { x: view.x + (clientX - vp.left - offX) / s, y: view.y + (clientY - vp.top - offY) / s };
}

/** Where a view point lands on the element, in pixels from its top-left corner (xMidYMid meet). */
export function viewToElement(view: ViewBox, size: Pick<Viewport, 'width' | 'height'>, p: Point): Point {
  const s = viewScale(view, size);
  return { x: (size.width - view.w * s) / 2 + (p.x - view.x) * s, y: (size.height - view.h * s) / 2 + (p.y - view.y) * s };
}

/**
 * The CSS transform (origin at the element's top-left) that makes the picture painted for
 * `committed` look like `live`: a uniform scale k and a shift. A drawing too big to repaint every
 * frame is moved this way during a gesture, on the compositor, and repainted once at the end.
 * Both are affine in the view point, so matching the images of the view's two corners fixes it:
 * k = s_live / s_committed and t = e_live(p) − k·e_committed(p) for any p.
 */
export function previewTransform(committed: ViewBox, live: ViewBox, size: Pick<Viewport, 'width' | 'height'>): { k: number; tx: number; ty: number } {
  const k = viewScale(live, size) / viewScale(committed, size);
  const p = { x: committed.x, y: committed.y };
  const a = viewToElement(committed, size, p);
  const b = viewToElement(live, size, p);
  return { k, tx: b.x - k * a.x, ty: b.y - k * a.y };
}

/** Smallest and largest view (its longer side), in view units. */
export interface ZoomLimits {
  min: number;
  max: number;
}

/** Close enough to read one hole's bushing; far enough to find the plate again. */
export function zoomLimitsFor(fit: ViewBox, pitch: number): ZoomLimits {
  const size = Math.max(fit.w, fit.h);
  return { min: Math.min(pitch / 2, size), max: size * 8 };
}

/** The zoom factor k (> 1 zooms in) cut back so the view stays inside the limits. */
export function limitZoom(view: ViewBox, k: number, limits: ZoomLimits): number {
  const size = Math.max(view.w, view.h);
  const next = Math.min(limits.max, Math.max(limits.min, size / k));
  return size / next;
}

/**
 * Zoom by k around p (view coordinates): p stays where it is on the screen. Under a uniform
 * scale about p, x' = p − (p − x)/k; with meet alignment the centering offset is unchanged,
 * because the scaled width w·s is.
 */
export function zoomAt(view: ViewBox, p: Point, k: number, limits: ZoomLimits): ViewBox {
  const f = limitZoom(view, k, limits);
  return { x: p.x - (p.x - view.x) / f, y: p.y - (p.y - view.y) / f, w: view.w / f, h: view.h / f };
}

export function zoomAtCenter(view: ViewBox, k: number, limits: ZoomLimits): ViewBox {
  return zoomAt(view, { x: view.x + view.w / 2, y: view.y + view.h / 2 }, k, limits);
}

export function panBy(view: ViewBox, dx: number, dy: number): ViewBox {
  return { ...view, x: view.x + dx, y: view.y + dy };
}

/**
 * Two-finger pinch, from the view when the gesture began. `anchor` is the fingers' midpoint
 * then and `now` their midpoint now, both read in the starting view; k is the ratio of finger
 * spreads. The plate point first under the fingers ends up under them again:
 * x' = anchor − (now − x₀)/k (drag and zoom in one step; with now = anchor it is zoomAt).
 */
export function pinchView(start: ViewBox, anchor: Point, now: Point, k: number, limits: ZoomLimits): ViewBox {
  const f = limitZoom(start, k, limits);
  return { x: anchor.x - (now.x - start.x) / f, y: anchor.y - (now.y - start.y) / f, w: start.w / f, h: start.h / f };
}

/**
 * A wheel event as a zoom factor. Lines and pages are turned into pixels first (WheelEvent
 * deltaMode 1 and 2), and one event is capped so a fast wheel cannot jump to the limits.
 * 100 px of wheel (one notch in most browsers) zooms by e^0.2 ≈ 1.22.
 */
export function wheelZoomFactor(deltaY: number, deltaMode: number): number {
  const px = deltaMode === 1 ? deltaY * 16 : deltaMode === 2 ? deltaY * 400 : deltaY;
  const capped = Math.max(-300, Math.min(300, px));
  return Math.exp(-capped * 0.002);
}

/**
 * The plate region whose labels are drawn: the view with half a view to spare on every side,
 * snapped outward to a grid of power-of-two cells about half a view across. Small pans and
 * zooms leave it unchanged, so the label layers re-render only now and then, never per frame.
 */
export function cullWindow(view: ViewBox): Box {
  const size = Math.max(view.w, view.h);
  const cell = 2 ** Math.ceil(Math.log2(size)) / 2;
  const snapDown = (v: number) => Math.floor(v / cell) * cell;
  const snapUp = (v: number) => Math.ceil(v / cell) * cell;
  // View y runs down the screen: plate y = −view y.
  return {
    minX: snapDown(view.x - view.w / 2),
    maxX: snapUp(view.x + view.w * 1.5),
    minY: snapDown(-(view.y + view.h * 1.5)),
    maxY: snapUp(-(view.y - view.h / 2)),
  };
}

/**
 * How much to draw at a zoom, from the on-screen size of one grid pitch. Text smaller than a
 * few pixels cannot be read and costs the most to paint, so it is left out until it can be.
 *  - 'sparse': outlines, crosses and the shared offset only
 *  - 'codes': plus component codes
 *  - 'full': plus station number tags
 */
export type Detail = 'sparse' | 'codes' | 'full';

export function detailFor(pixelsPerPitch: number): Detail {
  if (pixelsPerPitch >= 44) return 'full';
  if (pixelsPerPitch >= 20) return 'codes';
  return 'sparse';
}
