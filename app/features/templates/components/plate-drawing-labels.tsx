// The plate drawing's words: upright text at (x, −y), outside the scale(1, −1) group. Component
// codes are sized in plate units and placed once per content by layoutLabels (inside the drawing
// box, never piled up); the datum, shared-offset and problem words are sized in screen pixels
// and kept inside the part of the drawing box in view.
import { memo } from 'react';
import type { Point } from '../../../../shared/schemas/common';
import { boxContainsPoint, boxesIntersect, num, originSymbolData, type Box } from './plate-drawing-geometry';
import type { Ink } from './plate-drawing-layers';
import { boxInside, labelAlone, pushInside, type LabelRequest, type PlacedLabel } from './plate-drawing-label-layout';
import type { Detail } from './plate-drawing-view';
import type { DrawnPlacement, PlacementFault } from './plate-drawing-scene';

const textProps = (size: number, ink: Ink) => ({
  fontSize: size,
  textAnchor: 'middle' as const,
  dominantBaseline: 'central' as const,
  // A halo keeps a label legible over holes and outlines.
  paintOrder: 'stroke' as const,
  strokeWidth: size * 0.22,
  strokeLinejoin: 'round' as const,
  className: `${ink.text} ${ink.halo}`,
});

/** What the label layout is asked for a placement: its code, centered on it, never smaller than `minSize`. */
export const labelRequest = (p: DrawnPlacement, minSize = 0): LabelRequest =>
  ({ key: p.key, text: p.code, at: p.labelAt, size: Math.max(p.labelSize, minSize), vertical: p.labelVertical, bounds: p.bounds });

function Label({ text, at, ink, className, weight, placementKey }: { text: string; at: PlacedLabel; ink: Ink; className?: string; weight?: number; placementKey: string }) {
  const x = at.x;
  const y = -at.y;
  return (
    <text x={num(x)} y={num(y)} {...textProps(at.size, ink)} className={`font-mono ${className ?? ink.text} ${ink.halo}`} fontWeight={weight}
      data-label={placementKey} transform={at.vertical ? `rotate(-90 ${num(x)} ${num(y)})` : undefined}>
      {text}
    </text>
  );
}

export const CodeLabels = memo(function CodeLabels({ placements, placed, ink, detail, cull }: {
  placements: readonly DrawnPlacement[];
  /** From layoutLabels: a placement missing here has no free spot and is shown on hover or selection only. */
  placed: ReadonlyMap<string, PlacedLabel>;
  ink: Ink;
  detail: Detail;
  /** Only labels inside this plate box are drawn; null draws them all. */
  cull: Box | null;
}) {
  if (detail === 'sparse') return null;
  return (
    <g aria-hidden="true" pointerEvents="none">
      {placements.map((p) => {
        const at = placed.get(p.key);
        if (!at || (cull && !boxContainsPoint(cull, p.labelAt))) return null;
        return <Label key={p.key} placementKey={p.key} text={p.code} at={at} ink={ink} />;
      })}
    </g>
  );
});

/** The selected and the hovered placement's codes, on top, wherever the layout put (or left out) their labels. */
export const FocusLabels = memo(function FocusLabels({ selected, hovered, placed, drawingBox, minSize, ink }: {
  selected: DrawnPlacement | null;
  hovered: DrawnPlacement | null;
  placed: ReadonlyMap<string, PlacedLabel>;
  drawingBox: Box;
  minSize: number;
  ink: Ink;
}) {
  const shown = [selected, hovered && hovered !== selected ? hovered : null].filter((p): p is DrawnPlacement => !!p);
  if (shown.length === 0) return null;
  return (
    <g aria-hidden="true" pointerEvents="none">
      {shown.map((p) => (
        <Label key={p.key} placementKey={`focus:${p.key}`} text={p.code} at={placed.get(p.key) ?? labelAlone(labelRequest(p, minSize), drawingBox)} ink={ink}
          className={p === selected ? ink.selectedText : ink.text} weight={600} />
      ))}
    </g>
  );
});

/**
 * Words that must be read at any zoom (the datum, the shared offset, problems) are sized in
 * screen pixels: `px` is view units per pixel. They are few, so re-rendering them as the zoom
 * changes costs nothing.
 */
const LABEL_PX = 13;
/** Average advance of Inter's lowercase and digits is a little over half an em (common practice: 0.55 em for proportional UI faces). */
const TEXT_ADVANCE = 0.58;

export function DatumLabel({ holeRadius, px, ink }: { holeRadius: number; px: number; ink: Ink }) {
  const size = LABEL_PX * px;
  return (
    <text aria-hidden="true" pointerEvents="none" x={num(holeRadius * 1.35 + 3 * px)} y={num(holeRadius * 1.35 + size * 0.6 + 2 * px)}
      {...textProps(size, ink)} textAnchor="start">
      datum (0, 0)
    </text>
  );
}

export function OffsetLabels({ origin, arm, name, px, ink }: { origin: Point; arm: number; name: string; px: number; ink: Ink }) {
  const s = originSymbolData(origin, arm);
  const size = LABEL_PX * px;
  const base = textProps(size, ink);
  return (
    <g aria-hidden="true" pointerEvents="none" fontWeight={600}>
      <text x={num(s.xLabel.x + size * 0.4)} y={num(-s.xLabel.y)} {...base}>X</text>
      <text x={num(s.yLabel.x)} y={num(-s.yLabel.y - size * 0.4)} {...base}>Y</text>
      <text x={num(origin.x + arm * 0.15)} y={num(-origin.y + size * 1.1)} {...base} textAnchor="start">{name}</text>
    </g>
  );
}

/**
 * Problem words above their placements, each kept inside `box` (the drawing box in view) and
 * moved up or down a line at a time, within reach of its placement, until it meets no words placed
 * before it nor a component code; one that finds no room is left to its dashed outline and its title.
 */
export function FaultLabels({ faults, px, ink, box, avoid }: {
  faults: ReadonlyArray<{ fault: PlacementFault; placement: DrawnPlacement }>;
  px: number;
  ink: Ink;
  box: Box;
  /** Boxes already taken by other words (the component codes). */
  avoid: readonly Box[];
}) {
  if (faults.length === 0) return null;
  const size = LABEL_PX * px;
  const base = textProps(size, ink);
  const line = size * 1.35;
  const taken: Box[] = [];
  const spots: Array<{ fault: PlacementFault; placement: DrawnPlacement; x: number; y: number }> = [];
  for (const { fault, placement } of faults) {
    const text = `problem — ${fault.label}`;
    const w = text.length * TEXT_ADVANCE * size;
    const h = size * 1.2;
    // Preferred: starting at the placement's left edge, just above it (plate +Y is up).
    const x0 = placement.bounds.minX;
    const y0 = placement.bounds.maxY + size * 0.7;
    for (const step of [0, 1, -1, 2, -2, 3]) {
      const at = { minX: x0, minY: y0 + step * line - h / 2, maxX: x0 + w, maxY: y0 + step * line + h / 2 };
      const push = pushInside(at, box);
      if (!push) break;
      const b = { minX: at.minX + push.dx, minY: at.minY + push.dy, maxX: at.maxX + push.dx, maxY: at.maxY + push.dy };
      if (!boxInside(b, box) || taken.some((t) => boxesIntersect(t, b)) || avoid.some((t) => boxesIntersect(t, b))) continue;
      taken.push(b);
      spots.push({ fault, placement, x: b.minX, y: (b.minY + b.maxY) / 2 });
      break;
    }
  }
  return (
    <g fontWeight={600}>
      {spots.map(({ fault, placement, x, y }) => (
        // Clicking a problem's words selects the placement it is about.
        <g key={placement.key} role="img" data-placement={placement.id} className="cursor-pointer">
          <title>{fault.messages.length ? `Problem at placement ${fault.id}: ${fault.messages.join(' ')}` : `Problem at placement ${fault.id}.`}</title>
          <text x={num(x)} y={num(-y)} {...base} textAnchor="start" className={`${ink.faultText} ${ink.halo}`}>
            {`problem — ${fault.label}`}
          </text>
        </g>
      ))}
    </g>
  );
}
