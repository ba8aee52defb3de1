// Pan and zoom of the plate drawing by d3-zoom: the wheel, a drag, a pinch and the buttons all
// change one transform on a group inside the svg, whose viewBox stays the fitted plate. The
// transform is written to the group at once and handed to React once per frame (or, for a scene
// too heavy to repaint every frame, when the gesture ends), so labels and culling follow it.
import { useCallback, useEffect, useRef, useState, type RefObject } from 'react';
import { select } from 'd3-selection';
import { zoom as d3Zoom, zoomIdentity, type ZoomBehavior } from 'd3-zoom';
import { scaleExtentFor, transformShowing, viewOfTransform, zoomTransformAttr, type ViewBox, type ZoomLimits, type ZoomTransform } from './plate-drawing-view';

const IDENTITY: ZoomTransform = { k: 1, x: 0, y: 0 };
/** A press that moves less than this (px) is still a click: gloves are not precise. */
const CLICK_DISTANCE = 4;

export interface PlateZoom {
  /** The transform React has drawn with. */
  transform: ZoomTransform;
  /** The view box that transform shows. */
  view: ViewBox;
  zoomBy(k: number): void;
  /** Move the view by (dx, dy) view units. */
  panBy(dx: number, dy: number): void;
  /** Show `target` as large as fits. */
  show(target: ViewBox): void;
}

export function usePlateZoom(args: {
  svgRef: RefObject<SVGSVGElement | null>;
  groupRef: RefObject<SVGGElement | null>;
  /** The svg's viewBox: the transform's frame of reference. */
  base: ViewBox;
  /** A new key starts again from the whole base view. */
  resetKey: string;
  limits: ZoomLimits;
  heavy: boolean;
  disabled: boolean;
  /** While true, presses are not pans (a placement is being dragged). */
  blockRef: RefObject<boolean>;
}): PlateZoom {
  const { svgRef, groupRef, base, resetKey, limits, heavy, disabled, blockRef } = args;
  const [state, setState] = useState({ key: resetKey, transform: IDENTITY });
  if (state.key !== resetKey) setState({ key: resetKey, transform: IDENTITY });
  const transform = state.key === resetKey ? state.transform : IDENTITY;
  const behavior = useRef<ZoomBehavior<SVGSVGElement, unknown> | null>(null);
  const live = useRef<ZoomTransform>(transform);
  const frame = useRef(0);
  const heavyRef = useRef(heavy);
  useEffect(() => {
    heavyRef.current = heavy;
  }, [heavy]);

  const commit = useCallback(() => {
    if (frame.current) return;
    frame.current = requestAnimationFrame(() => {
      frame.current = 0;
      const t = live.current;
      setState((s) => (s.transform.k === t.k && s.transform.x === t.x && s.transform.y === t.y ? s : { ...s, transform: t }));
    });
  }, []);

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg || disabled) return;
    const z = d3Zoom<SVGSVGElement, unknown>()
      .clickDistance(CLICK_DISTANCE)
      // d3-zoom's own filter (no secondary button, Ctrl only with the wheel), and no pan while a placement is dragged.
      .filter((event: MouseEvent | TouchEvent | WheelEvent) => !blockRef.current && (!event.ctrlKey || event.type === 'wheel') && !(event as MouseEvent).button)
      .on('zoom', (event: { transform: ZoomTransform; sourceEvent: Event | null }) => {
        const { k, x, y } = event.transform;
        live.current = { k, x, y };
        groupRef.current?.setAttribute('transform', zoomTransformAttr(live.current));
        if (!heavyRef.current || !event.sourceEvent) commit();
      })
      .on('end', () => commit());
    behavior.current = z;
    const sel = select(svg);
    sel.call(z).on('dblclick.zoom', null);
    return () => {
      sel.on('.zoom', null);
      behavior.current = null;
      cancelAnimationFrame(frame.current);
      frame.current = 0;
    };
  }, [svgRef, groupRef, disabled, blockRef, commit]);

  const [kMin, kMax] = scaleExtentFor(base, limits);
  useEffect(() => {
    behavior.current?.scaleExtent([kMin, kMax]);
  }, [kMin, kMax, disabled]);

  // A new plate starts from the whole view; d3-zoom keeps its own copy on the element.
  useEffect(() => {
    const svg = svgRef.current;
    const z = behavior.current;
    live.current = IDENTITY;
    if (svg && z) z.transform(select(svg), zoomIdentity);
  }, [resetKey, svgRef]);

  const run = (f: (z: ZoomBehavior<SVGSVGElement, unknown>, svg: SVGSVGElement) => void) => {
    const svg = svgRef.current;
    const z = behavior.current;
    if (svg && z) f(z, svg);
  };
  return {
    transform,
    view: viewOfTransform(base, transform),
    zoomBy: (k) => run((z, svg) => z.scaleBy(select(svg), k)),
    panBy: (dx, dy) => run((z, svg) => z.translateBy(select(svg), -dx, -dy)),
    show: (target) => run((z, svg) => {
      const t = transformShowing(base, target);
      z.transform(select(svg), zoomIdentity.translate(t.x, t.y).scale(t.k));
    }),
  };
}
