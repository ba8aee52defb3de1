// Pan and zoom of the plate drawing by d3-zoom: the wheel, a drag, a pinch and the buttons all
// change one transform. d3-zoom listens on the frame around the svg and keeps its transform in
// the frame's pixels; the drawing turns it into the transform of a group inside the svg, whose
// viewBox stays the fitted plate. Light scenes are redrawn once per frame; a scene too heavy for
// that is moved as a picture (a CSS transform on the svg, on the compositor) until the gesture
// ends, then redrawn once, so labels and culling follow.
import { useCallback, useEffect, useLayoutEffect, useRef, useState, type RefObject } from 'react';
import { select } from 'd3-selection';
import { zoom as d3Zoom, zoomIdentity, type ZoomBehavior } from 'd3-zoom';
import { groupTransformOf, pixelTransformOf, previewTransform, scaleExtentFor, transformShowing, viewOfTransform, viewScale, zoomTransformAttr, type ViewBox, type ZoomLimits, type ZoomTransform } from './plate-drawing-view';

const IDENTITY: ZoomTransform = { k: 1, x: 0, y: 0 };
/** A press that moves less than this (px) is still a click: gloves are not precise. */
const CLICK_DISTANCE = 4;

const same = (a: ZoomTransform, b: ZoomTransform) => a.k === b.k && a.x === b.x && a.y === b.y;

export interface PlateZoom {
  /** The group transform (svg user units) React has drawn with. */
  transform: ZoomTransform;
  /** The view box it shows. */
  view: ViewBox;
  zoomBy(k: number): void;
  /** Move the view by (dx, dy) view units. */
  panBy(dx: number, dy: number): void;
  /** Show `target` as large as fits. */
  show(target: ViewBox): void;
}

export function usePlateZoom(args: {
  frameRef: RefObject<HTMLDivElement | null>;
  svgRef: RefObject<SVGSVGElement | null>;
  groupRef: RefObject<SVGGElement | null>;
  /** The svg's viewBox. */
  base: ViewBox;
  /** The svg's size on the screen (px). */
  size: { width: number; height: number };
  /** A new key starts again from the whole base view. */
  resetKey: string;
  limits: ZoomLimits;
  heavy: boolean;
  disabled: boolean;
  /** While true, presses are not pans (a placement is being dragged). */
  blockRef: RefObject<boolean>;
}): PlateZoom {
  const { frameRef, svgRef, groupRef, base, size, resetKey, limits, heavy, disabled, blockRef } = args;
  // The pixel transform d3-zoom keeps, as React last drew it.
  const [state, setState] = useState({ key: resetKey, pixels: IDENTITY });
  if (state.key !== resetKey) setState({ key: resetKey, pixels: IDENTITY });
  const pixels = state.key === resetKey ? state.pixels : IDENTITY;
  const behavior = useRef<ZoomBehavior<HTMLDivElement, unknown> | null>(null);
  /** Where gestures have taken the zoom, drawn or not. */
  const live = useRef<ZoomTransform>(pixels);
  /** What is painted: the pixel transform of the last render. */
  const drawn = useRef<ZoomTransform>(pixels);
  const frame = useRef(0);
  // The latest of what the handlers read, without adding d3 listeners again on each render.
  const latest = useRef({ heavy, base, size });
  useLayoutEffect(() => {
    latest.current = { heavy, base, size };
  });

  /** Show the live zoom: the group transform at once on a light scene, the picture moved on a heavy one. */
  const paint = useCallback((asPicture: boolean) => {
    const svg = svgRef.current;
    const t = live.current;
    if (!svg) return;
    if (asPicture && !same(t, drawn.current)) {
      const p = previewTransform(drawn.current, t);
      svg.style.transformOrigin = '0 0';
      svg.style.transform = `translate(${p.x}px, ${p.y}px) scale(${p.k})`;
      return;
    }
    svg.style.transform = '';
    const { base: b, size: s } = latest.current;
    groupRef.current?.setAttribute('transform', zoomTransformAttr(groupTransformOf(t, b, s)));
  }, [svgRef, groupRef]);

  const commit = useCallback(() => {
    if (frame.current) return;
    frame.current = requestAnimationFrame(() => {
      frame.current = 0;
      const t = live.current;
      setState((s) => (same(s.pixels, t) ? s : { ...s, pixels: t }));
    });
  }, []);

  // After each render the painted picture is what React drew; a gesture still under way is previewed again.
  useLayoutEffect(() => {
    drawn.current = pixels;
    if (svgRef.current && svgRef.current.style.transform) paint(true);
  }, [pixels, paint, svgRef]);

  useEffect(() => {
    const el = frameRef.current;
    if (!el || disabled) return;
    const z = d3Zoom<HTMLDivElement, unknown>()
      .clickDistance(CLICK_DISTANCE)
      // d3-zoom's own filter (no secondary button, Ctrl only with the wheel), and no pan while a placement is dragged.
      .filter((event: MouseEvent | TouchEvent | WheelEvent) => !blockRef.current && (!event.ctrlKey || event.type === 'wheel') && !(event as MouseEvent).button)
      .on('zoom', (event: { transform: ZoomTransform; sourceEvent: Event | null }) => {
        const { k, x, y } = event.transform;
        live.current = { k, x, y };
        const gesture = !!event.sourceEvent && latest.current.heavy;
        paint(gesture);
        if (!gesture) commit();
      })
      .on('end', () => commit());
    behavior.current = z;
    const sel = select(el);
    sel.call(z).on('dblclick.zoom', null);
    return () => {
      sel.on('.zoom', null);
      behavior.current = null;
      cancelAnimationFrame(frame.current);
      frame.current = 0;
    };
  }, [frameRef, disabled, blockRef, commit, paint]);

  const [kMin, kMax] = scaleExtentFor(base, limits);
  useEffect(() => {
    behavior.current?.scaleExtent([kMin, kMax]);
  }, [kMin, kMax, disabled]);

  // A new plate starts from the whole view; d3-zoom keeps its own copy on the element.
  useEffect(() => {
    const el = frameRef.current;
    const z = behavior.current;
    live.current = IDENTITY;
    if (el && z) z.transform(select(el), zoomIdentity);
  }, [resetKey, frameRef]);

  const run = (f: (z: ZoomBehavior<HTMLDivElement, unknown>, el: HTMLDivElement) => void) => {
    const el = frameRef.current;
    const z = behavior.current;
    if (el && z) f(z, el);
  };
  const group = groupTransformOf(pixels, base, size);
  return {
    transform: group,
    view: viewOfTransform(base, group),
    zoomBy: (k) => run((z, el) => z.scaleBy(select(el), k)),
    // Content moves against the view, by the view's units turned into pixels of the unzoomed drawing.
    panBy: (dx, dy) => run((z, el) => {
      const s = viewScale(base, size);
      z.translateBy(select(el), -dx * s, -dy * s);
    }),
    show: (target) => run((z, el) => {
      const t = pixelTransformOf(transformShowing(base, target), base, size);
      z.transform(select(el), zoomIdentity.translate(t.x, t.y).scale(t.k));
    }),
  };
}
