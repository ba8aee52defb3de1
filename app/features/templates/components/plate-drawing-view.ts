// The drawing's viewBox and how a d3-zoom transform maps onto it. Pure, so the math is tested
// without a browser; d3-zoom itself turns wheel, drag and pinch into the transform.
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
export function viewScale(view: ViewBox, vp: { width: number; height: number }): number {
  return Math.min(vp.width / view.w, vp.height / view.h);
}

/**
 * A zoom as d3-zoom keeps it: user point u = k·v + (x, y), applied to a group inside the svg
 * whose viewBox is `base` (SVG 1.1, "transform" attribute: translate(x y) scale(k)).
 */
export interface ZoomTransform {
  k: number;
  x: number;
  y: number;
}

/** The view box a zoom shows: the base box mapped back through the transform, v = (u − t) / k. */
export function viewOfTransform(base: ViewBox, t: ZoomTransform): ViewBox {
  return { x: (base.x - t.x) / t.k, y: (base.y - t.y) / t.k, w: base.w / t.k, h: base.h / t.k };
}

/**
 * The zoom that shows `target` inside `base`, as large as fits and centered (the inverse of
 * viewOfTransform when the boxes have one shape): k = min of the two ratios, and the target's
 * center lands on the base's center, t = c_base − k·c_target.
 */
export function transformShowing(base: ViewBox, target: ViewBox): ZoomTransform {
  const k = Math.min(base.w / target.w, base.h / target.h);
  return { k, x: base.x + base.w / 2 - k * (target.x + target.w / 2), y: base.y + base.h / 2 - k * (target.y + target.h / 2) };
}

export const zoomTransformAttr = (t: ZoomTransform) => `translate(${t.x} ${t.y}) scale(${t.k})`;

/**
 * Where the svg puts user point u on the element, in pixels from its top-left: p = s·u + o,
 * with s from viewScale and the spare space split evenly (xMidYMid meet).
 */
export function userToPixels(base: ViewBox, size: { width: number; height: number }): { s: number; ox: number; oy: number } {
  const s = viewScale(base, size);
  return { s, ox: (size.width - base.w * s) / 2 - base.x * s, oy: (size.height - base.h * s) / 2 - base.y * s };
}

/**
 * d3-zoom on the frame keeps a transform in the frame's pixels, p' = k·p + t; the same picture
 * as a transform of a group in the svg's user units, u' = k·u + g: from p = s·u + o,
 * s·u' + o = k·(s·u + o) + t, so g = (k·o + t − o) / s.
 */
export function groupTransformOf(pixels: ZoomTransform, base: ViewBox, size: { width: number; height: number }): ZoomTransform {
  const { s, ox, oy } = userToPixels(base, size);
  return { k: pixels.k, x: (pixels.k * ox + pixels.x - ox) / s, y: (pixels.k * oy + pixels.y - oy) / s };
}

/** The inverse of groupTransformOf: t = s·g + o − k·o. */
export function pixelTransformOf(group: ZoomTransform, base: ViewBox, size: { width: number; height: number }): ZoomTransform {
  const { s, ox, oy } = userToPixels(base, size);
  return { k: group.k, x: s * group.x + ox - group.k * ox, y: s * group.y + oy - group.k * oy };
}

/**
 * The CSS transform (origin at the element's top-left) that makes a picture painted under pixel
 * transform `drawn` look as it would under `live`: live = A ∘ drawn with A(p) = a·p + b, so
 * a = k_live / k_drawn and b = t_live − a·t_drawn (CSS Transforms 1: translate(b) scale(a)).
 */
export function previewTransform(drawn: ZoomTransform, live: ZoomTransform): ZoomTransform {
  const a = live.k / drawn.k;
  return { k: a, x: live.x - a * drawn.x, y: live.y - a * drawn.y };
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

/** The limits as d3-zoom's scale extent [k_min, k_max] over a base view: k = base size / view size. */
export function scaleExtentFor(base: ViewBox, limits: ZoomLimits): [number, number] {
  const size = Math.max(base.w, base.h);
  return [size / limits.max, size / limits.min];
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
