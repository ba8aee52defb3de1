// The plate drawing's layers. Each is memoized on props that change only with the content (or,
// for labels, with the level of detail), so zooming and panning, which change only the root
// viewBox, do not re-render 2,000 placements and 16,000 stations.
//
// Geometry layers are children of one scale(1, -1) group and draw in plate coordinates (+Y up,
// ISO 841). Label layers (plate-drawing-labels.tsx) sit outside it, at (x, −y), so text stays upright.
import { memo, useImperativeHandle, useMemo, useState, type Ref } from 'react';
import type { Hole } from '../../../../shared/schemas/template';
import { arrowPathData, boxContainsPoint, boxPathData, circlePathData, holeBlocks, num, originSymbolData, type Box } from './plate-drawing-geometry';
import type { Detail } from './plate-drawing-view';
import type { DrawnPlacement, DrawnStation, PlacementMove } from './plate-drawing-scene';

/** Tailwind classes for each thing drawn. Safety hues appear only where a problem is named in words. */
export interface Ink {
  plate: string;
  hole: string;
  /** Stroke-only classes go on elements drawn with fill="none": a fill class would beat that attribute. */
  datum: string;
  datumDot: string;
  component: string;
  componentLines: string;
  selected: string;
  selectedLines: string;
  selectedText: string;
  text: string;
  halo: string;
  station: string;
  tag: string;
  order: string;
  offset: string;
  older: string;
  arrow: string;
  fault: string;
  faultText: string;
  hover: string;
}

export const SCREEN_INK: Ink = {
  plate: 'fill-slate-100 stroke-slate-500',
  hole: 'stroke-slate-400',
  datum: 'stroke-slate-900',
  datumDot: 'fill-slate-900',
  component: 'fill-slate-300/70 stroke-slate-700',
  componentLines: 'stroke-slate-700',
  selected: 'fill-accent-100/80 stroke-accent-700',
  selectedLines: 'stroke-accent-700',
  selectedText: 'fill-accent-800',
  text: 'fill-slate-900',
  halo: 'stroke-white',
  station: 'stroke-slate-900',
  tag: 'fill-white stroke-slate-700',
  order: 'stroke-slate-600',
  offset: 'stroke-slate-900 fill-slate-900',
  older: 'stroke-slate-500',
  arrow: 'stroke-slate-900 fill-slate-900',
  fault: 'stroke-danger-700',
  faultText: 'fill-danger-700',
  hover: 'stroke-accent-700',
};

/** Black strokes on white for setup sheets (print: black on white); the words and dash patterns carry the meaning. */
export const PRINT_INK: Ink = {
  plate: 'fill-white stroke-black',
  hole: 'stroke-black',
  datum: 'stroke-black',
  datumDot: 'fill-black',
  component: 'fill-white stroke-black',
  componentLines: 'stroke-black',
  selected: 'fill-white stroke-black',
  selectedLines: 'stroke-black',
  selectedText: 'fill-black',
  text: 'fill-black',
  halo: 'stroke-white',
  station: 'stroke-black',
  tag: 'fill-white stroke-black',
  order: 'stroke-black',
  offset: 'stroke-black fill-black',
  older: 'stroke-black',
  arrow: 'stroke-black fill-black',
  fault: 'stroke-black',
  faultText: 'fill-black',
  hover: 'stroke-black',
};

// Stroke widths in screen pixels: vector-effect keeps them constant at any zoom. Paths with
// thousands of pieces (crosses, the order, holes) stay at 1 px: the rasterizer draws those as
// hairlines, several times faster than any wider stroke.
const NS = 'non-scaling-stroke' as const;

/** Above this many holes the path strings grow to megabytes; a repeating pattern draws the same. */
export const HOLE_PATH_LIMIT = 40_000;

/**
 * Up to this many labels or station tags are all drawn, wherever the view is, so a screen reader
 * meets every station's title on an ordinary template. Beyond it only those near the view are
 * (the cull window), and the station table is the full list.
 */
export const UNCULLED_LIMIT = 1_500;

export const PlateLayer = memo(function PlateLayer(props: {
  pitch: number;
  columns: number;
  rows: number;
  holeRadius: number;
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  patternId: string;
  ink: Ink;
}) {
  const { pitch, columns, rows, holeRadius: r, minX, minY, maxX, maxY, patternId, ink } = props;
  const holes = useMemo(
    () => (columns * rows <= HOLE_PATH_LIMIT ? holeBlocks({ pitch, columns, rows }, r) : null),
    [pitch, columns, rows, r],
  );
  return (
    <g aria-hidden="true">
      <path d={boxPathData({ minX, minY, maxX, maxY })} className={ink.plate} strokeWidth={1.5} vectorEffect={NS} />
      {holes !== null ? (
        <g fill="none" className={ink.hole} strokeWidth={1}>
          {holes.map((d, i) => <path key={i} d={d} vectorEffect={NS} />)}
        </g>
      ) : (
        <>
          <defs>
            <pattern id={patternId} patternUnits="userSpaceOnUse" x={-pitch / 2} y={-pitch / 2} width={pitch} height={pitch}>
              <circle cx={pitch / 2} cy={pitch / 2} r={r} fill="none" className={ink.hole} strokeWidth={r * 0.15} />
            </pattern>
          </defs>
          <rect x={-pitch / 2} y={-pitch / 2} width={columns * pitch} height={rows * pitch} fill={`url(#${patternId})`} />
        </>
      )}
      {/* The datum hole: a heavier ring with a filled center, so it reads apart from the grid. */}
      <circle cx={0} cy={0} r={r * 1.35} fill="none" className={ink.datum} strokeWidth={2.5} vectorEffect={NS} />
      <circle cx={0} cy={0} r={r * 0.35} className={ink.datumDot} />
    </g>
  );
});

export const ComponentsLayer = memo(function ComponentsLayer({ placements, ink, variant, draggable = false }: {
  placements: readonly DrawnPlacement[];
  ink: Ink;
  /** The placements can be dragged to another hole: a move cursor says so. */
  draggable?: boolean;
  /** 'older' is the comparison version: faint, dashed, beneath, and not clickable. */
  variant: 'current' | 'older';
}) {
  if (variant === 'older') {
    return (
      <g aria-hidden="true" pointerEvents="none" fill="none" className={ink.older} strokeWidth={1} strokeDasharray="5 4" opacity={0.85}>
        {placements.map((p) => (
          <g key={p.key} transform={p.transform}>
            <path d={p.shape.fill + p.shape.lines} vectorEffect={NS} />
          </g>
        ))}
      </g>
    );
  }
  return (
    <g>
      {placements.map((p) => (
        // Clicks are found by data-placement on one listener, not by 2,000 handlers.
        <g key={p.key} role="img" data-placement={p.id} transform={p.transform} className={draggable ? 'cursor-move' : 'cursor-pointer'}>
          <title>{p.title}</title>
          <path d={p.shape.fill} fillRule="evenodd" className={ink.component} strokeWidth={1} vectorEffect={NS} />
          {p.shape.lines ? <path d={p.shape.lines} fill="none" className={ink.componentLines} strokeWidth={1} vectorEffect={NS} /> : null}
        </g>
      ))}
    </g>
  );
});

/** The selected placement drawn again on top in the accent color, so selecting repaints one shape, not all. */
export const SelectionLayer = memo(function SelectionLayer({ placement, ink }: { placement: DrawnPlacement | null; ink: Ink }) {
  if (!placement) return null;
  return (
    <g aria-hidden="true" pointerEvents="none" transform={placement.transform}>
      <path d={placement.shape.fill} fillRule="evenodd" className={ink.selected} strokeWidth={3} vectorEffect={NS} />
      {placement.shape.lines ? <path d={placement.shape.lines} fill="none" className={ink.selectedLines} strokeWidth={2} vectorEffect={NS} /> : null}
    </g>
  );
});

export const FaultOutlines = memo(function FaultOutlines({ placements, ink }: { placements: readonly DrawnPlacement[]; ink: Ink }) {
  if (placements.length === 0) return null;
  return (
    <g aria-hidden="true" pointerEvents="none" fill="none" className={ink.fault} strokeWidth={2.5} strokeDasharray="7 4">
      {placements.map((p) => (
        <g key={p.key} transform={p.transform}>
          <path d={p.shape.fill + p.shape.lines} vectorEffect={NS} />
        </g>
      ))}
    </g>
  );
});

export const OrderLayer = memo(function OrderLayer({ d, ink }: { d: string; ink: Ink }) {
  if (!d) return null;
  return <path aria-hidden="true" pointerEvents="none" d={d} fill="none" className={ink.order} strokeWidth={1} strokeLinejoin="round" vectorEffect={NS} />;
});

export const CrossesLayer = memo(function CrossesLayer({ d, ink, faint }: { d: string; ink: Ink; faint?: boolean }) {
  if (!d) return null;
  return (
    <path aria-hidden="true" pointerEvents="none" d={d} fill="none" className={faint ? ink.older : ink.station}
      strokeWidth={1} opacity={faint ? 0.7 : 1} vectorEffect={NS} />
  );
});

export const MovedLayer = memo(function MovedLayer({ moves, head, ink }: { moves: readonly PlacementMove[]; head: number; ink: Ink }) {
  const arrows = useMemo(() => {
    let shafts = '';
    let heads = '';
    for (const m of moves) {
      const a = arrowPathData(m.from, m.to, head);
      if (!a) continue;
      shafts += a.shaft;
      heads += a.head;
    }
    return { shafts, heads };
  }, [moves, head]);
  if (!arrows.shafts) return null;
  return (
    <g aria-hidden="true" pointerEvents="none" className={ink.arrow}>
      <path d={arrows.shafts} fill="none" strokeWidth={2} vectorEffect={NS} />
      <path d={arrows.heads} stroke="none" />
    </g>
  );
});

export const OffsetSymbol = memo(function OffsetSymbol({ x, y, arm, ink }: { x: number; y: number; arm: number; ink: Ink }) {
  const s = useMemo(() => originSymbolData({ x, y }, arm), [x, y, arm]);
  return (
    <g aria-hidden="true" pointerEvents="none" className={ink.offset}>
      <path d={s.axes} fill="none" strokeWidth={2.5} vectorEffect={NS} />
      <path d={s.heads} stroke="none" />
      <path d={circlePathData(x, y, arm * 0.12)} fill="none" strokeWidth={2} vectorEffect={NS} />
    </g>
  );
});

/** The hole under the pointer, when holes can be clicked. Its own state, so hovering repaints one ring. */
export interface HoleHoverHandle {
  show(hole: Hole | null): void;
}

export function HoleHover({ handle, pitch, r, ink }: { handle: Ref<HoleHoverHandle>; pitch: number; r: number; ink: Ink }) {
  const [hole, setHole] = useState<Hole | null>(null);
  useImperativeHandle(handle, () => ({
    show: (next) => setHole((prev) => (prev?.col === next?.col && prev?.row === next?.row ? prev : next)),
  }), []);
  if (!hole) return null;
  return <circle aria-hidden="true" pointerEvents="none" cx={hole.col * pitch} cy={hole.row * pitch} r={r * 1.8} fill="none" className={ink.hover} strokeWidth={2.5} vectorEffect={NS} />;
}


/**
 * Station crosses are one path (CrossesLayer); here each station gets its number tag and a
 * title. When the tags are too small to read, an invisible dot keeps the title under the pointer.
 */
export const StationTags = memo(function StationTags({ stations, ink, tag, cross, detail, cull }: {
  stations: readonly DrawnStation[];
  ink: Ink;
  tag: number;
  cross: number;
  detail: Detail;
  /** Only stations inside this plate box get a tag and title; null gives every station one. */
  cull: Box | null;
}) {
  // Zoomed out over many stations, the crosses path alone shows them: thousands of invisible
  // hit dots would cost more to paint than everything else.
  if (cull && detail === 'sparse') return null;
  const shown = cull ? stations.filter((s) => boxContainsPoint(cull, s.datum)) : stations;
  // The tag sits up and right of the cross (45°), clear of the cross itself.
  const off = cross + tag * 0.85;
  return (
    <g>
      {shown.map((s) => {
        const x = s.datum.x + off;
        const y = -(s.datum.y + off);
        const digits = String(s.number).length;
        const size = tag * (digits <= 2 ? 1.15 : digits === 3 ? 0.85 : digits === 4 ? 0.66 : 0.54);
        return (
          <g key={s.id} role="img" data-placement={s.placement} className="cursor-pointer">
            <title>{s.title}</title>
            {detail === 'full' ? (
              <>
                <circle cx={num(x)} cy={num(y)} r={tag} className={ink.tag} strokeWidth={1} vectorEffect={NS} />
                <text x={num(x)} y={num(y)} fontSize={size} textAnchor="middle" dominantBaseline="central" className={`font-mono ${ink.text}`}>{s.number}</text>
              </>
            ) : (
              <circle cx={num(s.datum.x)} cy={num(-s.datum.y)} r={cross * 1.5} fill="transparent" />
            )}
          </g>
        );
      })}
    </g>
  );
});
