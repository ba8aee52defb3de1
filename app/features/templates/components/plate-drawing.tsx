import { useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent, type MouseEvent, type PointerEvent } from 'react';
import { AlertOctagon, Maximize, ZoomIn, ZoomOut } from 'lucide-react';
import type { Hole } from '../../../../shared/schemas/template';
import { Button } from '../../../components/ui/button';
import { boxesIntersect, nearestHole, unionBox } from './plate-drawing-geometry';
import { cullWindow, detailFor, fitView, viewBoxAttr, viewScale, viewToPlateBox, zoomLimitsFor, zoomTransformAttr, type ViewBox } from './plate-drawing-view';
import {
  buildPlateScene,
  buildStationScene,
  comparePlacements,
  describeDrawing,
  faultsByPlacement,
} from './plate-drawing-scene';
import type { PlateDrawingProps } from './plate-drawing-props';
import {
  ComponentsLayer,
  CrossesLayer,
  FaultOutlines,
  HoleHover,
  MovedLayer,
  OffsetSymbol,
  OrderLayer,
  PlateLayer,
  PRINT_INK,
  SCREEN_INK,
  SelectionLayer,
  StationTags,
  UNCULLED_LIMIT,
  type HoleHoverHandle,
} from './plate-drawing-layers';
import { CodeLabels, DatumLabel, FaultLabels, FocusLabels, labelRequest, OffsetLabels } from './plate-drawing-labels';
import { layoutLabels } from './plate-drawing-label-layout';
import { usePlateZoom } from './plate-drawing-zoom';
import { DragGhost, plateAtClient, usePlacementDrag } from './plate-drawing-drag';
import { ComparisonLegend, DragStatus, PointerReadout, type ReadoutHandle } from './plate-drawing-chrome';

export type { PlateDrawingOrigin, PlateDrawingOverlay, PlateDrawingProps } from './plate-drawing-props';

/** How far from a hole center a click on empty plate still means that hole: gloves are not precise. */
const HOLE_HIT = 0.5;
const KEY_ZOOM = 1.25;
/**
 * Above about this many drawn things (placements, stations, an eighth of the holes) a repaint
 * takes longer than a frame on a shop-floor PC, so a gesture moves the painted group and the
 * labels catch up when it ends.
 */
const HEAVY_SCENE = 3_000;
/** Smallest component code on the screen, in px: smaller cannot be read at arm's length. */
const MIN_CODE_PX = 10;
/** More problem labels than this in view are replaced by one line of words over the drawing. */
const MAX_FAULT_LABELS = 30;
const NO_FAULTS: never[] = [];

/** Arrow keys as one hole along the plate's axes: Up is +Y, away from the operator (ISO 841). */
const NUDGE: Record<string, Hole> = { ArrowLeft: { col: -1, row: 0 }, ArrowRight: { col: 1, row: 0 }, ArrowUp: { col: 0, row: 1 }, ArrowDown: { col: 0, row: -1 } };

/**
 * A template drawn on its plate: holes, components from their outlines, stations with their
 * numbers, the shared offset, and on demand the machining order, problems and an older version.
 * Zoom with the wheel, a pinch, the buttons or +/−; pan by dragging or with the arrow keys
 * (d3-zoom). Where placements can be moved, drag one to a hole, or nudge the selected one with the
 * arrow keys; R turns it.
 */
export function PlateDrawing(props: PlateDrawingProps) {
  const {
    content, stations, origin, displayUnit, selectedPlacement = null, onSelectPlacement, onHoleClick, onMovePlacement, checkMove, onRotatePlacement,
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
  const [hoveredId, setHoveredId] = useState<string | null>(null);
  const hovered = hoveredId ? plate.byId.get(hoveredId) ?? null : null;

  // ---- the view ----
  // Room beyond the plate for the datum and offset labels and for the problem words.
  const fit = useMemo(() => {
    const box = older ? unionBox(plate.extent, older.extent) : plate.extent;
    return fitView(box, Math.max(plate.pitch * 0.6, Math.max(box.maxX - box.minX, box.maxY - box.minY) * 0.04));
  }, [plate, older]);
  // The svg's viewBox is the fitted view of the plate as first shown; editing placements (even
  // past the edge) keeps it, and with it where the user has zoomed to. A new plate starts again.
  const plateKey = `${unit}|${plate.pitch}|${plate.columns}|${plate.rows}|${plate.edge.minX}|${plate.edge.minY}`;
  const [baseState, setBaseState] = useState<{ key: string; base: ViewBox }>(() => ({ key: plateKey, base: fit }));
  if (baseState.key !== plateKey) setBaseState({ key: plateKey, base: fit });
  const base = printMode || baseState.key !== plateKey ? fit : baseState.base;
  const limits = useMemo(() => zoomLimitsFor(base, plate.pitch), [base, plate.pitch]);
  const heavy = !printMode &&
    plate.placements.length + stationScene.stations.length + (older?.placements.length ?? 0) + (olderStations?.stations.length ?? 0) + (plate.columns * plate.rows) / 8 > HEAVY_SCENE;

  const frameRef = useRef<HTMLDivElement>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const groupRef = useRef<SVGGElement>(null);
  // Pixels per pitch decide the level of detail; the frame's size comes from a ResizeObserver
  // (the frame's, not the svg's: a heavy gesture moves the svg with a CSS transform).
  const [size, setSize] = useState({ width: 800, height: 500 });
  useLayoutEffect(() => {
    const el = frameRef.current;
    if (!el) return;
    const measure = () => {
      const width = el.clientWidth;
      const height = el.clientHeight;
      if (width > 1 && height > 1) setSize((s) => (s.width === width && s.height === height ? s : { width, height }));
    };
    measure();
    if (typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  const blockRef = useRef(false);
  const zoom = usePlateZoom({ frameRef, svgRef, groupRef, base, size, resetKey: plateKey, limits, heavy, disabled: printMode, blockRef });
  const view = printMode ? fit : zoom.view;
  const fitNow = () => zoom.show(fit);

  const scale = viewScale(view, size);
  const detail = printMode ? 'full' : detailFor(scale * plate.pitch);
  // View units per screen pixel for the few labels that keep a constant size; in print, a
  // size tied to the pitch, since the page, not a screen, scales the drawing.
  const px = printMode ? sizes.text / 13 : 1 / scale;
  // Labels near the view only, when there are too many to draw all; the window moves in steps.
  const nearView = cullWindow(view);
  const { minX, maxX, minY, maxY } = nearView;
  const cull = useMemo(() => ({ minX, maxX, minY, maxY }), [minX, maxX, minY, maxY]);
  const stationCull = printMode || stationScene.stations.length <= UNCULLED_LIMIT ? null : cull;
  const labelCull = printMode || plate.placements.length <= UNCULLED_LIMIT ? null : cull;

  // ---- labels: inside the drawing box, clear of each other and of the station tags ----
  const drawingBox = useMemo(() => viewToPlateBox(fit), [fit]);
  // Codes are sized on the plate, but never under MIN_CODE_PX on the screen; the size steps by
  // quarter octaves of zoom, so the layout is redone now and then, not on every frame.
  const minCode = printMode ? 0 : MIN_CODE_PX * 2 ** (Math.ceil(Math.log2(px) * 4) / 4);
  const placedLabels = useMemo(() => {
    const off = sizes.cross + sizes.tag * 0.85;
    // Station tags are drawn, and so kept clear, only when close enough to read.
    const tags = detail === 'full' && stationScene.stations.length <= UNCULLED_LIMIT
      ? stationScene.stations.map((s) => ({ minX: s.datum.x + off - sizes.tag, minY: s.datum.y + off - sizes.tag, maxX: s.datum.x + off + sizes.tag, maxY: s.datum.y + off + sizes.tag }))
      : [];
    return layoutLabels(plate.placements.map((p) => labelRequest(p, minCode)), drawingBox, tags);
  }, [plate, stationScene, drawingBox, sizes.cross, sizes.tag, minCode, detail]);
  const codeBoxes = useMemo(() => (detail === 'sparse' ? [] : [...placedLabels.values()].map((l) => l.box)), [placedLabels, detail]);

  // Problem words are few and screen-sized; past a handful in view they would bury the
  // drawing, so the outlines stay and one line above the drawing says how many.
  const inView = viewToPlateBox(view);
  const faultsInView = printMode ? faulty : faulty.filter((f) => boxesIntersect(inView, f.placement.bounds));
  const faultWordsHidden = faultsInView.length > MAX_FAULT_LABELS;
  const faultBox = printMode ? drawingBox : {
    minX: Math.max(inView.minX, drawingBox.minX), minY: Math.max(inView.minY, drawingBox.minY),
    maxX: Math.min(inView.maxX, drawingBox.maxX), maxY: Math.min(inView.maxY, drawingBox.maxY),
  };

  // ---- pointer: drag a placement, click, hover, readout (pan and zoom are d3-zoom's) ----
  const canDrag = !printMode && !!onMovePlacement;
  const dragging = usePlacementDrag({ enabled: canDrag, plate, groupRef, blockRef, ...(checkMove ? { checkMove } : {}), ...(onMovePlacement ? { onMove: onMovePlacement } : {}) });
  const { drag } = dragging;
  /** A refused nudge, in words, until the next key or press. */
  const [notice, setNotice] = useState<string | null>(null);
  const readout = useRef<ReadoutHandle>(null);
  const hover = useRef<HoleHoverHandle>(null);

  const onClick = (e: MouseEvent<SVGSVGElement>) => {
    if (printMode || dragging.takeClick()) return;
    const id = e.target instanceof Element ? e.target.closest('[data-placement]')?.getAttribute('data-placement') : null;
    if (id) {
      onSelectPlacement?.(id);
      return;
    }
    const at = plateAtClient(groupRef.current, e.clientX, e.clientY);
    const near = at ? nearestHole(at, plate) : null;
    if (onHoleClick && near && near.onPlate && near.distance <= plate.pitch * HOLE_HIT) {
      onHoleClick(near.hole);
      return;
    }
    onSelectPlacement?.(null);
  };

  const onPointerDown = (e: PointerEvent<SVGSVGElement>) => {
    setNotice(null);
    dragging.handlers.onPointerDown(e);
    // A press on a placement selects it at once, so the drag shows it in the accent color.
    const id = e.target instanceof Element ? e.target.closest('[data-placement]')?.getAttribute('data-placement') : null;
    if (canDrag && id && id !== selectedPlacement) onSelectPlacement?.(id);
  };

  const onPointerMove = (e: PointerEvent<SVGSVGElement>) => {
    dragging.handlers.onPointerMove(e);
    if (printMode) return;
    const at = plateAtClient(groupRef.current, e.clientX, e.clientY);
    readout.current?.show(at);
    const over = e.target instanceof Element ? e.target.closest('[data-placement]')?.getAttribute('data-placement') ?? null : null;
    if (over !== hoveredId && !drag) setHoveredId(over);
    if (onHoleClick && at) {
      const near = nearestHole(at, plate);
      hover.current?.show(near.onPlate && !over && near.distance <= plate.pitch * HOLE_HIT ? near.hole : null);
    }
  };

  const onPointerLeave = () => {
    readout.current?.show(null);
    hover.current?.show(null);
    setHoveredId(null);
  };

  const onKeyDown = (e: KeyboardEvent<SVGSVGElement>) => {
    if (e.altKey || e.ctrlKey || e.metaKey || e.target !== svgRef.current) return;
    setNotice(null);
    const step = e.shiftKey ? 0.5 : 0.1;
    const nudge = NUDGE[e.key];
    if (nudge && selected && onMovePlacement && !e.shiftKey) {
      const hole = { col: selected.hole.col + nudge.col, row: selected.hole.row + nudge.row };
      const refusal = checkMove?.(selected.id, hole) ?? null;
      if (refusal) setNotice(refusal);
      else onMovePlacement(selected.id, hole);
      e.preventDefault();
      return;
    }
    switch (e.key) {
      case '+':
      case '=':
        zoom.zoomBy(KEY_ZOOM);
        break;
      case '-':
      case '_':
        zoom.zoomBy(1 / KEY_ZOOM);
        break;
      // Arrows move the view the way they point: Up shows more of +Y (view y runs down).
      case 'ArrowLeft':
        zoom.panBy(-view.w * step, 0);
        break;
      case 'ArrowRight':
        zoom.panBy(view.w * step, 0);
        break;
      case 'ArrowUp':
        zoom.panBy(0, -view.h * step);
        break;
      case 'ArrowDown':
        zoom.panBy(0, view.h * step);
        break;
      case '0':
      case 'Home':
        fitNow();
        break;
      case 'r':
      case 'R':
        if (!selected || !onRotatePlacement) return;
        onRotatePlacement(selected.id);
        break;
      case 'Escape':
        if (drag) {
          dragging.cancel();
          break;
        }
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
  const dragged = drag ? plate.byId.get(drag.id) ?? null : null;

  return (
    <div className={`flex flex-col gap-2 ${className}`}>
      {overlay && changes ? <ComparisonLegend changes={changes} olderLabel={overlay.label ?? 'older version'} newerLabel={label ?? 'this version'} printMode={printMode} /> : null}
      <div
        ref={frameRef}
        className={`relative overflow-hidden rounded border ${printMode ? 'border-black bg-white' : 'touch-none cursor-grab border-slate-300 bg-white'}`}
        style={printMode ? { breakInside: 'avoid' } : { height }}
      >
        <svg
          ref={svgRef}
          viewBox={viewBoxAttr(base)}
          role="group"
          aria-roledescription="plate drawing"
          aria-label={ariaLabel}
          aria-describedby={printMode ? undefined : hintId}
          tabIndex={printMode ? undefined : 0}
          data-testid="plate-drawing"
          // No transitions anywhere: zoom and fit jump, which also honors prefers-reduced-motion.
          // The focus ring is drawn inside the edge because the frame clips what lies outside it.
          className={`block w-full select-none ${printMode ? 'h-auto' : 'h-full touch-none rounded focus-visible:outline-3 focus-visible:-outline-offset-3 focus-visible:outline-accent-600'}`}
          // A heavy drawing keeps its own compositor layer, so moving it as a picture never re-rasterizes it.
          style={printMode ? { aspectRatio: `${fit.w} / ${fit.h}`, maxHeight: '9in' } : heavy ? { willChange: 'transform' } : undefined}
          {...(printMode ? {} : {
            onClick, onKeyDown, onPointerDown, onPointerMove, onPointerLeave,
            onPointerUp: dragging.handlers.onPointerUp, onPointerCancel: dragging.handlers.onPointerCancel,
          })}
        >
          <g ref={groupRef} transform={printMode ? undefined : zoomTransformAttr(zoom.transform)}>
            <g transform="scale(1 -1)">
              <PlateLayer pitch={plate.pitch} columns={plate.columns} rows={plate.rows} holeRadius={plate.holeRadius}
                minX={plate.edge.minX} minY={plate.edge.minY} maxX={plate.edge.maxX} maxY={plate.edge.maxY} patternId={`${uid}-holes`} ink={ink} />
              {older ? <ComponentsLayer placements={older.placements} ink={ink} variant="older" /> : null}
              {olderStations ? <CrossesLayer d={olderStations.crosses} ink={ink} faint /> : null}
              <ComponentsLayer placements={plate.placements} ink={ink} variant="current" draggable={canDrag} />
              <SelectionLayer placement={selected} ink={ink} />
              <FaultOutlines placements={faultyPlacements} ink={ink} />
              {showOrder ? <OrderLayer d={stationScene.order} ink={ink} /> : null}
              <CrossesLayer d={stationScene.crosses} ink={ink} />
              {changes ? <MovedLayer moves={changes.moved} head={sizes.arrowHead} ink={ink} /> : null}
              <OffsetSymbol x={stationScene.origin.x} y={stationScene.origin.y} arm={sizes.arm} ink={ink} />
              {onHoleClick && !printMode ? <HoleHover handle={hover} pitch={plate.pitch} r={plate.holeRadius} ink={ink} /> : null}
              <DragGhost drag={drag} placement={dragged} pitch={plate.pitch} ink={ink} />
            </g>
            <CodeLabels placements={plate.placements} placed={placedLabels} ink={ink} detail={detail} cull={labelCull} />
            <StationTags stations={stationScene.stations} ink={ink} tag={sizes.tag} cross={sizes.cross} detail={detail} cull={stationCull} />
            <FocusLabels selected={selected} hovered={printMode ? null : hovered} placed={placedLabels} drawingBox={drawingBox} minSize={minCode} ink={ink} />
            <DatumLabel holeRadius={plate.holeRadius} px={px} ink={ink} />
            <OffsetLabels origin={stationScene.origin} arm={sizes.arm} name={stationScene.offsetName} px={px} ink={ink} />
            <FaultLabels faults={faultWordsHidden ? NO_FAULTS : faultsInView} px={px} ink={ink} box={faultBox} avoid={codeBoxes} />
          </g>
        </svg>
        {faultWordsHidden && !drag ? (
          // Over the drawing, not above it: appearing and going as the zoom changes must not move the drawing.
          <p className={`pointer-events-none absolute left-2 top-2 flex items-center gap-2 rounded border bg-white/95 px-2 py-1 text-sm font-semibold ${printMode ? 'border-black text-black' : 'border-danger-700 text-danger-700'}`}>
            <AlertOctagon aria-hidden className="h-4 w-4 shrink-0" />
            {`problem: ${faultsInView.length} placements in view are at fault (dashed outlines); zoom in to read which and why.`}
          </p>
        ) : null}
        {printMode ? null : <DragStatus drag={drag} notice={notice} />}
      </div>
      {printMode ? null : (
        <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => zoom.zoomBy(1 / KEY_ZOOM)}>
              <ZoomOut aria-hidden className="h-4 w-4" />Zoom out
            </Button>
            <Button variant="secondary" onClick={() => zoom.zoomBy(KEY_ZOOM)}>
              <ZoomIn aria-hidden className="h-4 w-4" />Zoom in
            </Button>
            <Button variant="secondary" onClick={fitNow} title="Fit the plate in the drawing (key 0)">
              <Maximize aria-hidden className="h-4 w-4" />Fit
            </Button>
          </div>
          <PointerReadout handle={readout} plate={plate} origin={stationScene.origin} displayUnit={displayUnit} offsetName={stationScene.offsetName} />
          <p id={hintId} className="text-sm text-slate-600">
            Drag to pan; wheel or pinch to zoom. With the drawing focused: + and − zoom, arrow keys pan, 0 fits the plate
            {onSelectPlacement ? ', Escape clears the selection' : ''}
            {canDrag ? '. Drag a placement to a hole to move it; with one selected, arrow keys move it a hole (Shift+arrows pan) and R turns it' : ''}.
          </p>
        </div>
      )}
    </div>
  );
}
