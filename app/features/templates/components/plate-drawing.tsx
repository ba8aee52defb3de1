import {
  useCallback,
  useEffect,
  useId,
  useImperativeHandle,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  type KeyboardEvent,
  type PointerEvent,
  type Ref,
} from 'react';
import { AlertOctagon, Maximize, ZoomIn, ZoomOut } from 'lucide-react';
import type { Point, Unit } from '../../../../shared/schemas/common';
import type { Hole, Station, TemplateContent } from '../../../../shared/schemas/template';
import { Button } from '../../../components/ui/button';
import { boxesIntersect, nearestHole, unionBox } from './plate-drawing-geometry';
import {
  clientToView,
  cullWindow,
  detailFor,
  fitView,
  panBy,
  pinchView,
  previewTransform,
  viewBoxAttr,
  viewScale,
  viewToPlate,
  viewToPlateBox,
  wheelZoomFactor,
  zoomAt,
  zoomAtCenter,
  zoomLimitsFor,
  type ViewBox,
  type Viewport,
} from './plate-drawing-view';
import {
  buildPlateScene,
  buildStationScene,
  comparePlacements,
  describeDrawing,
  faultsByPlacement,
  pointerReadout,
  type FaultInput,
  type PlacementChanges,
  type PlateScene,
} from './plate-drawing-scene';
import {
  CodeLabels,
  ComponentsLayer,
  CrossesLayer,
  DatumLabel,
  FaultLabels,
  FaultOutlines,
  HoleHover,
  MovedLayer,
  OffsetLabels,
  OffsetSymbol,
  OrderLayer,
  PlateLayer,
  PRINT_INK,
  SCREEN_INK,
  SelectedLabel,
  SelectionLayer,
  StationTags,
  UNCULLED_LIMIT,
  type HoleHoverHandle,
} from './plate-drawing-layers';

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

/** How far from a hole center a click on empty plate still means that hole: gloves are not precise. */
const HOLE_HIT = 0.5;
/** Pointer travel (px) below which a press is a click, not a drag. */
const CLICK_SLOP = 4;
const KEY_ZOOM = 1.25;
/**
 * Above about this many drawn things (placements, stations, an eighth of the holes) a repaint
 * takes longer than a frame on a shop-floor PC, so gestures preview with a CSS transform.
 */
const HEAVY_SCENE = 3_000;
/** A wheel gesture counts as over after this long without a wheel event. */
const WHEEL_SETTLE_MS = 160;
/** More problem labels than this in view are replaced by one line of words over the drawing. */
const MAX_FAULT_LABELS = 30;
const NO_FAULTS: never[] = [];

interface Gesture {
  pointers: Map<number, Point>;
  mode: 'idle' | 'pan' | 'pinch';
  rect: Viewport;
  startView: ViewBox;
  startClient: Point;
  startAt: Point;
  spread: number;
  moved: boolean;
  target: Element | null;
}

const newGesture = (): Gesture => ({
  pointers: new Map(),
  mode: 'idle',
  rect: { left: 0, top: 0, width: 1, height: 1 },
  startView: { x: 0, y: 0, w: 1, h: 1 },
  startClient: { x: 0, y: 0 },
  startAt: { x: 0, y: 0 },
  spread: 1,
  moved: false,
  target: null,
});

/** The frame's content box on screen: where the svg is laid out, whatever transform it has. */
const viewportOf = (el: HTMLElement): Viewport => {
  const r = el.getBoundingClientRect();
  return { left: r.left + el.clientLeft, top: r.top + el.clientTop, width: el.clientWidth || 1, height: el.clientHeight || 1 };
};

const midpoint = (a: Point, b: Point): Point => ({ x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 });

/**
 * A template drawn on its plate: holes, components from their outlines, stations with their
 * numbers, the shared offset, and on demand the machining order, problems and an older version.
 * Zoom with the wheel, a pinch, the buttons or +/−; pan by dragging or with the arrow keys.
 */
export function PlateDrawing(props: PlateDrawingProps) {
  const {
    content, stations, origin, displayUnit, selectedPlacement = null, onSelectPlacement, onHoleClick,
    showOrder = false, overlay, label, problems, printMode = false, height = 'min(70vh, 36rem)', className = '',
  } = props;
  const ink = printMode ? PRINT_INK : SCREEN_INK;
  const uid = useId().replace(/[^A-Za-z0-9_-]/g, '');

  // ---- the scene, rebuilt only when its inputs change ----
  const plate = useMemo(() => buildPlateScene(content), [content]);
  const unit = plate.unit;
  const { sizes } = plate;
  // Origins are compared by value: callers often rebuild the object on each render.
  const { x: originX, y: originY } = origin;
  const stationScene = useMemo(
    () => buildStationScene(content, stations, { x: originX, y: originY }, unit, displayUnit, sizes.cross),
    [content, stations, originX, originY, unit, displayUnit, sizes.cross],
  );
  const overlayContent = overlay?.content;
  const overlayStations = overlay?.stations;
  const overlayX = overlay?.origin.x ?? 0;
  const overlayY = overlay?.origin.y ?? 0;
  const older = useMemo(() => (overlayContent ? buildPlateScene(overlayContent, unit) : null), [overlayContent, unit]);
  const olderStations = useMemo(
    () =>
      overlayContent && overlayStations && older
        ? buildStationScene(overlayContent, overlayStations, { x: overlayX, y: overlayY }, unit, displayUnit, sizes.cross)
        : null,
    [older, overlayContent, overlayStations, overlayX, overlayY, unit, displayUnit, sizes.cross],
  );
  const changes = useMemo(() => (older ? comparePlacements(older, plate) : null), [older, plate]);
  const faults = useMemo(() => faultsByPlacement(problems ?? []), [problems]);
  const faulty = useMemo(
    () => [...faults.values()].flatMap((fault) => {
      const placement = plate.byId.get(fault.id);
      return placement ? [{ fault, placement }] : [];
    }),
    [faults, plate],
  );
  const faultyPlacements = useMemo(() => faulty.map((f) => f.placement), [faulty]);
  const selected = selectedPlacement ? plate.byId.get(selectedPlacement) ?? null : null;

  // ---- the view ----
  const fit = useMemo(
    // Room beyond the plate for the datum and offset labels and for the problem words.
    () => {
      const box = older ? unionBox(plate.extent, older.extent) : plate.extent;
      return fitView(box, Math.max(plate.pitch * 0.6, Math.max(box.maxX - box.minX, box.maxY - box.minY) * 0.04));
    },
    [plate, older],
  );
  const limits = useMemo(() => zoomLimitsFor(fit, plate.pitch), [fit, plate.pitch]);
  // A new plate (or unit) starts from the fitted view; editing placements keeps where you are.
  const plateKey = `${unit}|${plate.pitch}|${plate.columns}|${plate.rows}|${plate.edge.minX}|${plate.edge.minY}`;
  const [viewState, setViewState] = useState(() => ({ key: plateKey, view: fit }));
  if (viewState.key !== plateKey) setViewState({ key: plateKey, view: fit });
  /** The committed view: the svg's viewBox. */
  const view = printMode || viewState.key !== plateKey ? fit : viewState.view;

  // Too much to repaint every frame? Then a gesture moves the painted picture with a CSS
  // transform (compositor only) and the viewBox is committed when the gesture ends.
  const heavy = !printMode &&
    plate.placements.length + stationScene.stations.length + (older?.placements.length ?? 0) + (olderStations?.stations.length ?? 0) + (plate.columns * plate.rows) / 8 > HEAVY_SCENE;

  const svgRef = useRef<SVGSVGElement>(null);
  const frameRef = useRef<HTMLDivElement>(null);
  /** The live view: where gestures have taken the view, committed or not. */
  const viewRef = useRef(view);
  /** The view the DOM shows right now. */
  const shownRef = useRef(view);
  const viewKeyRef = useRef(plateKey);
  const commitFrame = useRef(0);
  const settleTimer = useRef(0);

  const showPreview = useCallback(() => {
    const el = svgRef.current;
    const frame = frameRef.current;
    if (!el || !frame) return;
    const live = viewRef.current;
    const shown = shownRef.current;
    if (live.x === shown.x && live.y === shown.y && live.w === shown.w && live.h === shown.h) {
      el.style.transform = '';
      return;
    }
    const t = previewTransform(shown, live, viewportOf(frame));
    el.style.transform = `translate(${t.tx}px, ${t.ty}px) scale(${t.k})`;
  }, []);

  // After each commit the preview is re-based on what is now painted, or cleared, in the same frame.
  useLayoutEffect(() => {
    if (viewKeyRef.current !== plateKey) {
      viewKeyRef.current = plateKey;
      viewRef.current = view;
    }
    shownRef.current = view;
    showPreview();
  }, [view, plateKey, showPreview]);
  useEffect(() => () => {
    cancelAnimationFrame(commitFrame.current);
    window.clearTimeout(settleTimer.current);
  }, []);

  /** Commit the live view, once per animation frame however many events asked. */
  const commit = useCallback(() => {
    window.clearTimeout(settleTimer.current);
    settleTimer.current = 0;
    if (commitFrame.current) return;
    commitFrame.current = requestAnimationFrame(() => {
      commitFrame.current = 0;
      const v = viewRef.current;
      setViewState((s) => ({ ...s, view: v }));
    });
  }, []);

  /** A step (key, button, fit) commits at once; a gesture on a heavy scene only previews until it settles. */
  const moveView = (next: (v: ViewBox) => ViewBox, gestureStep = false) => {
    viewRef.current = next(viewRef.current);
    if (heavy && gestureStep) showPreview();
    else commit();
  };
  const fitNow = () => moveView(() => fit);

  // Pixels per pitch decide the level of detail; the frame's size comes from a ResizeObserver.
  const [size, setSize] = useState({ width: 0, height: 0 });
  useLayoutEffect(() => {
    const el = frameRef.current;
    if (!el) return;
    const measure = () => {
      const { width, height } = viewportOf(el);
      setSize((s) => (s.width === width && s.height === height ? s : { width, height }));
    };
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const scale = size.width > 1 && size.height > 1 ? viewScale(view, size) : viewScale(view, { width: 800, height: 500 });
  const detail = printMode ? 'full' : detailFor(scale * plate.pitch);
  // View units per screen pixel for the few labels that keep a constant size; in print, a
  // size tied to the pitch, since the page, not a screen, scales the drawing.
  const px = printMode ? sizes.text / 13 : 1 / scale;
  // Labels near the view only, when there are too many to draw all; the window moves in steps.
  const nearView = cullWindow(view);
  const { minX, maxX, minY, maxY } = nearView;
  // Memoized on its value, so the label layers get a new window only when it steps.
  const cull = useMemo(() => ({ minX, maxX, minY, maxY }), [minX, maxX, minY, maxY]);
  const stationCull = printMode || stationScene.stations.length <= UNCULLED_LIMIT ? null : cull;
  const labelCull = printMode || plate.placements.length <= UNCULLED_LIMIT ? null : cull;
  // Problem words are few and screen-sized; past a handful in view they would bury the
  // drawing, so the outlines stay and one line above the drawing says how many.
  const inView = viewToPlateBox(view);
  const faultsInView = printMode ? faulty : faulty.filter((f) => boxesIntersect(inView, f.placement.bounds));
  const faultWordsHidden = faultsInView.length > MAX_FAULT_LABELS;

  // ---- pointer: pan, pinch, click, readout ----
  // Listeners sit on the frame, not the svg: during a preview the svg is moved and may not
  // cover the frame, and a wheel over the uncovered part must still zoom, not scroll the page.
  const gesture = useRef<Gesture>(newGesture());
  const readout = useRef<ReadoutHandle>(null);
  const hover = useRef<HoleHoverHandle>(null);

  const platePointAt = (rect: Viewport, clientX: number, clientY: number) =>
    viewToPlate(clientToView(viewRef.current, rect, clientX, clientY));

  const click = (rect: Viewport, clientX: number, clientY: number, target: Element | null) => {
    const hit = target?.closest('[data-placement]');
    const id = hit?.getAttribute('data-placement');
    if (id) {
      onSelectPlacement?.(id);
      return;
    }
    const near = nearestHole(platePointAt(rect, clientX, clientY), plate);
    if (onHoleClick && near.onPlate && near.distance <= plate.pitch * HOLE_HIT) {
      onHoleClick(near.hole);
      return;
    }
    onSelectPlacement?.(null);
  };

  const startPan = (g: Gesture, client: Point, moved: boolean) => {
    g.mode = 'pan';
    g.startView = viewRef.current;
    g.startClient = client;
    g.startAt = clientToView(g.startView, g.rect, client.x, client.y);
    g.moved = moved;
  };

  const onPointerDown = (e: PointerEvent<HTMLDivElement>) => {
    if (printMode || (e.pointerType === 'mouse' && e.button !== 0)) return;
    const g = gesture.current;
    if (g.pointers.size >= 2) return;
    try {
      e.currentTarget.setPointerCapture(e.pointerId);
    } catch {
      // A pointer the browser no longer knows (lifted already) cannot be captured; carry on uncaptured.
    }
    g.pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
    g.rect = viewportOf(e.currentTarget);
    if (g.pointers.size === 1) {
      g.target = e.target instanceof Element ? e.target : null;
      startPan(g, { x: e.clientX, y: e.clientY }, false);
    } else {
      const [a, b] = [...g.pointers.values()] as [Point, Point];
      g.mode = 'pinch';
      g.startView = viewRef.current;
      const mid = midpoint(a, b);
      g.startAt = clientToView(g.startView, g.rect, mid.x, mid.y);
      g.spread = Math.hypot(a.x - b.x, a.y - b.y) || 1;
      g.moved = true; // a pinch never ends in a click
    }
  };

  const onPointerMove = (e: PointerEvent<HTMLDivElement>) => {
    if (printMode) return;
    const g = gesture.current;
    const rect = g.pointers.size ? g.rect : viewportOf(e.currentTarget);
    if (g.pointers.size <= 1) {
      const p = platePointAt(rect, e.clientX, e.clientY);
      readout.current?.show(p);
      if (onHoleClick) {
        const near = nearestHole(p, plate);
        const overComponent = e.target instanceof Element && !!e.target.closest('[data-placement]');
        hover.current?.show(near.onPlate && !overComponent && near.distance <= plate.pitch * HOLE_HIT ? near.hole : null);
      }
    }
    if (!g.pointers.has(e.pointerId)) return;
    g.pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
    if (g.mode === 'pan') {
      if (!g.moved && Math.hypot(e.clientX - g.startClient.x, e.clientY - g.startClient.y) > CLICK_SLOP) g.moved = true;
      if (!g.moved) return;
      const now = clientToView(g.startView, g.rect, e.clientX, e.clientY);
      const { startView, startAt } = g;
      moveView(() => panBy(startView, startAt.x - now.x, startAt.y - now.y), true);
    } else if (g.mode === 'pinch') {
      const [a, b] = [...g.pointers.values()] as [Point, Point];
      const mid = midpoint(a, b);
      const now = clientToView(g.startView, g.rect, mid.x, mid.y);
      const k = Math.hypot(a.x - b.x, a.y - b.y) / g.spread;
      const { startView, startAt } = g;
      moveView(() => pinchView(startView, startAt, now, k, limits), true);
    }
  };

  const endPointer = (e: PointerEvent<HTMLDivElement>, cancelled: boolean) => {
    const g = gesture.current;
    if (!g.pointers.has(e.pointerId)) return;
    const wasClick = !cancelled && g.mode === 'pan' && !g.moved;
    g.pointers.delete(e.pointerId);
    if (e.currentTarget.hasPointerCapture?.(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    if (wasClick) click(g.rect, e.clientX, e.clientY, g.target);
    const rest = [...g.pointers.values()][0];
    // Lifting one finger of a pinch carries on as a drag with the other.
    if (rest) {
      startPan(g, rest, true);
    } else {
      g.mode = 'idle';
      commit();
    }
  };

  const onPointerLeave = () => {
    if (gesture.current.pointers.size) return;
    readout.current?.show(null);
    hover.current?.show(null);
  };

  // React attaches wheel listeners as passive, so preventDefault (keeping the page still) needs
  // a native one; it calls the latest handler through a ref so it is added once.
  const onWheel = (e: WheelEvent) => {
    e.preventDefault();
    const frame = frameRef.current;
    if (!frame) return;
    const rect = viewportOf(frame);
    const k = wheelZoomFactor(e.deltaY, e.deltaMode);
    moveView((v) => zoomAt(v, clientToView(v, rect, e.clientX, e.clientY), k, limits), true);
    if (heavy) {
      window.clearTimeout(settleTimer.current);
      settleTimer.current = window.setTimeout(commit, WHEEL_SETTLE_MS);
    }
  };
  const wheelRef = useRef(onWheel);
  useLayoutEffect(() => {
    wheelRef.current = onWheel;
  });
  useEffect(() => {
    const el = frameRef.current;
    if (!el || printMode) return;
    const listener = (e: WheelEvent) => wheelRef.current(e);
    el.addEventListener('wheel', listener, { passive: false });
    return () => el.removeEventListener('wheel', listener);
  }, [printMode]);

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.altKey || e.ctrlKey || e.metaKey || e.target !== svgRef.current) return;
    const step = e.shiftKey ? 0.5 : 0.1;
    const v = viewRef.current;
    switch (e.key) {
      case '+':
      case '=':
        moveView((w) => zoomAtCenter(w, KEY_ZOOM, limits));
        break;
      case '-':
      case '_':
        moveView((w) => zoomAtCenter(w, 1 / KEY_ZOOM, limits));
        break;
      // Arrows move the view the way they point: Up shows more of +Y (view y runs down).
      case 'ArrowLeft':
        moveView((w) => panBy(w, -v.w * step, 0));
        break;
      case 'ArrowRight':
        moveView((w) => panBy(w, v.w * step, 0));
        break;
      case 'ArrowUp':
        moveView((w) => panBy(w, 0, -v.h * step));
        break;
      case 'ArrowDown':
        moveView((w) => panBy(w, 0, v.h * step));
        break;
      case '0':
      case 'Home':
        fitNow();
        break;
      case 'Escape':
        if (!onSelectPlacement || selectedPlacement === null) return;
        onSelectPlacement(null);
        break;
      default:
        return;
    }
    e.preventDefault();
  };

  const overlayLabel = overlay ? overlay.label ?? 'an older version' : undefined;
  const ariaLabel = useMemo(
    () => describeDrawing({ content, plate, stations: stationScene, displayUnit, faults: faulty.length, ...(overlayLabel === undefined ? {} : { overlayLabel }) }),
    [content, plate, stationScene, displayUnit, faulty.length, overlayLabel],
  );
  const hintId = `${uid}-hint`;

  return (
    <div className={`flex flex-col gap-2 ${className}`}>
      {overlay && changes ? <ComparisonLegend changes={changes} olderLabel={overlay.label ?? 'older version'} newerLabel={label ?? 'this version'} printMode={printMode} /> : null}
      <div
        ref={frameRef}
        className={`relative overflow-hidden rounded border ${printMode ? 'border-black bg-white' : 'touch-none cursor-grab border-slate-300 bg-white'}`}
        style={printMode ? { breakInside: 'avoid' } : { height }}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={(e) => endPointer(e, false)}
        onPointerCancel={(e) => endPointer(e, true)}
        onPointerLeave={onPointerLeave}
        onKeyDown={printMode ? undefined : onKeyDown}
      >
        <svg
          ref={svgRef}
          viewBox={viewBoxAttr(view)}
          role="group"
          aria-roledescription="plate drawing"
          aria-label={ariaLabel}
          aria-describedby={printMode ? undefined : hintId}
          tabIndex={printMode ? undefined : 0}
          // No transitions anywhere: zoom and fit jump, which also honors prefers-reduced-motion.
          // The focus ring is drawn inside the edge because the frame clips what lies outside it.
          className={`block w-full select-none ${printMode ? 'h-auto' : 'h-full touch-none rounded focus-visible:outline-3 focus-visible:-outline-offset-3 focus-visible:outline-accent-600'}`}
          // A heavy drawing keeps its own compositor layer, so a preview transform never re-rasterizes it.
          style={printMode ? { aspectRatio: `${fit.w} / ${fit.h}`, maxHeight: '9in' } : heavy ? { transformOrigin: '0 0', willChange: 'transform' } : { transformOrigin: '0 0' }}
        >
          <g transform="scale(1 -1)">
            <PlateLayer pitch={plate.pitch} columns={plate.columns} rows={plate.rows} holeRadius={plate.holeRadius}
              minX={plate.edge.minX} minY={plate.edge.minY} maxX={plate.edge.maxX} maxY={plate.edge.maxY} patternId={`${uid}-holes`} ink={ink} />
            {older ? <ComponentsLayer placements={older.placements} ink={ink} variant="older" /> : null}
            {olderStations ? <CrossesLayer d={olderStations.crosses} ink={ink} faint /> : null}
            <ComponentsLayer placements={plate.placements} ink={ink} variant="current" />
            <SelectionLayer placement={selected} ink={ink} />
            <FaultOutlines placements={faultyPlacements} ink={ink} />
            {showOrder ? <OrderLayer d={stationScene.order} ink={ink} /> : null}
            <CrossesLayer d={stationScene.crosses} ink={ink} />
            {changes ? <MovedLayer moves={changes.moved} head={sizes.arrowHead} ink={ink} /> : null}
            <OffsetSymbol x={stationScene.origin.x} y={stationScene.origin.y} arm={sizes.arm} ink={ink} />
            {onHoleClick && !printMode ? <HoleHover handle={hover} pitch={plate.pitch} r={plate.holeRadius} ink={ink} /> : null}
          </g>
          <CodeLabels placements={plate.placements} ink={ink} detail={detail} cull={labelCull} />
          <SelectedLabel placement={selected} ink={ink} />
          <StationTags stations={stationScene.stations} ink={ink} tag={sizes.tag} cross={sizes.cross} detail={detail} cull={stationCull} />
          <DatumLabel holeRadius={plate.holeRadius} px={px} ink={ink} />
          <OffsetLabels origin={stationScene.origin} arm={sizes.arm} name={stationScene.offsetName} px={px} ink={ink} />
          <FaultLabels faults={faultWordsHidden ? NO_FAULTS : faultsInView} px={px} ink={ink} />
        </svg>
        {faultWordsHidden ? (
          // Over the drawing, not above it: appearing and going as the zoom changes must not move the drawing.
          <p className={`pointer-events-none absolute left-2 top-2 flex items-center gap-2 rounded border bg-white/95 px-2 py-1 text-sm font-semibold ${printMode ? 'border-black text-black' : 'border-danger-700 text-danger-700'}`}>
            <AlertOctagon aria-hidden className="h-4 w-4 shrink-0" />
            {`problem: ${faultsInView.length} placements in view are at fault (dashed outlines); zoom in to read which and why.`}
          </p>
        ) : null}
      </div>
      {printMode ? null : (
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <div className="flex gap-2">
            <Button variant="secondary" onClick={() => moveView((v) => zoomAtCenter(v, 1 / KEY_ZOOM, limits))}>
              <ZoomOut aria-hidden className="h-4 w-4" />Zoom out
            </Button>
            <Button variant="secondary" onClick={() => moveView((v) => zoomAtCenter(v, KEY_ZOOM, limits))}>
              <ZoomIn aria-hidden className="h-4 w-4" />Zoom in
            </Button>
            <Button variant="secondary" onClick={fitNow} title="Fit the plate in the drawing (key 0)">
              <Maximize aria-hidden className="h-4 w-4" />Fit
            </Button>
          </div>
          <PointerReadout handle={readout} plate={plate} origin={stationScene.origin} displayUnit={displayUnit} offsetName={stationScene.offsetName} />
          <p id={hintId} className="text-sm text-slate-600">
            Drag to pan; wheel or pinch to zoom. With the drawing focused: + and − zoom, arrow keys pan, 0 fits the plate
            {onSelectPlacement ? ', Escape clears the selection' : ''}.
          </p>
        </div>
      )}
    </div>
  );
}

// ---------- the pointer readout: its own state, so a pointer move repaints one line ----------

interface ReadoutHandle {
  show(platePoint: Point | null): void;
}

function PointerReadout({ handle, plate, origin, displayUnit, offsetName }: {
  handle: Ref<ReadoutHandle>;
  plate: PlateScene;
  origin: Point;
  displayUnit: Unit;
  offsetName: string;
}) {
  const [at, setAt] = useState<Point | null>(null);
  useImperativeHandle(handle, () => ({ show: setAt }), []);
  if (!at) {
    return <p className="min-h-10 flex-1 py-2 text-base text-slate-600">Point at the plate to read X and Y from the {offsetName}.</p>;
  }
  const r = pointerReadout(at, plate, origin, displayUnit);
  return (
    // aria-live off: a value per pointer move would drown a screen reader; the titles tell the story.
    <p aria-live="off" className="min-h-10 flex-1 py-2 text-base">
      <span className="sr-only">Pointer, from the {offsetName}: </span>
      <span className="num inline-block min-w-[11ch]">X {r.x}</span>{' '}
      <span className="num ml-3 inline-block min-w-[11ch]">Y {r.y}</span>{' '}
      <span className="ml-3 text-slate-700">{r.hole ? <>nearest hole <span className="num">({r.hole.col}, {r.hole.row})</span></> : 'off the grid'}</span>
    </p>
  );
}

// ---------- the comparison legend: above the drawing, so zooming never hides it ----------

function ComparisonLegend({ changes, olderLabel, newerLabel, printMode }: { changes: PlacementChanges; olderLabel: string; newerLabel: string; printMode: boolean }) {
  const stroke = printMode ? 'stroke-black' : 'stroke-slate-700';
  const fill = printMode ? 'fill-black' : 'fill-slate-700';
  const faint = printMode ? 'stroke-black' : 'stroke-slate-500';
  const list = (ids: readonly string[]) => (ids.length <= 8 ? ids.join(', ') : `${ids.slice(0, 8).join(', ')} and ${ids.length - 8} more`);
  const moved = changes.moved.map((m) => m.id);
  return (
    <div role="group" aria-label="Legend" className="flex flex-wrap items-center gap-x-5 gap-y-1 text-sm text-slate-800">
      <span className="font-semibold">Legend</span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><line x1="1" y1="6" x2="31" y2="6" className={faint} strokeWidth="1.5" strokeDasharray="5 4" /></svg>
        {olderLabel} (dashed)
      </span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><rect x="1" y="2" width="30" height="8" className={`${printMode ? 'fill-white' : 'fill-slate-300/70'} ${stroke}`} strokeWidth="1" /></svg>
        {newerLabel} (solid)
      </span>
      <span className="inline-flex items-center gap-2">
        <svg aria-hidden width="32" height="12"><path d="M1 6H24" className={stroke} strokeWidth="2" /><path d="M31 6L23 1.5V10.5Z" className={fill} /></svg>
        moved, old → new: {moved.length ? <span className="font-mono">{list(moved)}</span> : 'none'}
      </span>
      {changes.turned.length ? <span>turned in place: <span className="font-mono">{list(changes.turned)}</span></span> : null}
      {changes.added.length ? <span>added: <span className="font-mono">{list(changes.added)}</span></span> : null}
      {changes.removed.length ? <span>removed: <span className="font-mono">{list(changes.removed)}</span></span> : null}
    </div>
  );
}
