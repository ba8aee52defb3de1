import { useEffect, useMemo, useRef, useState } from 'react';
import type { Point } from '../../../../shared/schemas/common';
import { circleData, crossData } from '../../../lib/outline-svg';
import { pathsByLayer, previewView, toScreen, type LayeredOutline } from '../outline-preview';

export interface CircleMark {
  /** Index into outline.circles. */
  index: number;
  kind: 'dowel' | 'primary' | 'stop';
  label: string;
}

interface OutlineDrawingProps {
  outline: LayeredOutline;
  /** What the drawing shows, for screen readers: it is a picture; the tables hold the numbers. */
  title: string;
  hiddenLayers?: ReadonlySet<string>;
  marks?: readonly CircleMark[];
  /** Marks the local origin (a stored outline's primary dowel) with crossed X and Y axes. */
  origin?: boolean;
}

/** Pixels per drawing unit as rendered (the viewBox is fitted with "meet"), so labels keep a readable size. */
function useRenderedScale(view: { width: number; height: number } | null) {
  const ref = useRef<SVGSVGElement>(null);
  const [scale, setScale] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el || !view) return;
    const measure = () => setScale(Math.min(el.clientWidth / view.width, el.clientHeight / view.height));
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, [view]);
  return { ref, scale };
}

/**
 * An outline seen from above with +Y up (ISO 841: +X right, +Y away from the operator), fitted
 * to its box. Geometry is drawn in drawing coordinates inside one scale(1, −1) group; labels
 * sit outside it at (x, −y) so their text is not mirrored.
 */
export function OutlineDrawing({ outline, title, hiddenLayers, marks = [], origin = false }: OutlineDrawingProps) {
  const view = useMemo(() => previewView(outline), [outline]);
  const layers = useMemo(() => pathsByLayer(outline), [outline]);
  const { ref, scale } = useRenderedScale(view);
  if (!view) return <p className="text-slate-600">Nothing to draw: the outline holds no lines, arcs or circles.</p>;
  const shown = layers.filter((l) => !hiddenLayers?.has(l.layer));
  const fill = shown.map((l) => l.closed + l.circles).join('');
  const px = scale > 0 ? 1 / scale : view.width / 800;
  const font = 14 * px;
  const aspect = Math.min(4, Math.max(1, view.width / view.height));
  const visibleMarks = marks.filter((m) => {
    const c = outline.circles[m.index];
    return c && !hiddenLayers?.has(c.layer ?? '0');
  });
  const originArm = Math.max(view.width, view.height) * 0.08;

  return (
    <svg ref={ref} role="img" aria-label={title} viewBox={view.viewBox} preserveAspectRatio="xMidYMid meet"
      className="block max-h-[28rem] w-full rounded border border-slate-300 bg-white" style={{ aspectRatio: String(aspect) }}>
      <title>{title}</title>
      <g transform="scale(1 -1)">
        {fill ? <path d={fill} fillRule="evenodd" className="fill-slate-200" /> : null}
        {shown.map((l) => (
          <path key={l.layer} d={l.closed + l.open + l.circles} fill="none" className="stroke-slate-700" strokeWidth={1.5} vectorEffect="non-scaling-stroke" data-layer={l.layer} />
        ))}
        {visibleMarks.map((m) => {
          const c = outline.circles[m.index]!;
          return (
            <g key={m.index} className={m.kind === 'stop' ? 'stroke-accent-600' : 'stroke-accent-700'} fill="none" vectorEffect="non-scaling-stroke">
              <path d={circleData(c)} strokeWidth={m.kind === 'primary' ? 4 : 3} strokeDasharray={m.kind === 'stop' ? '4 3' : undefined} vectorEffect="non-scaling-stroke" />
              {m.kind === 'primary' ? <path d={crossData(c, c.r * 1.6)} strokeWidth={2} vectorEffect="non-scaling-stroke" /> : null}
            </g>
          );
        })}
        {origin ? <OriginAxes at={{ x: 0, y: 0 }} arm={originArm} /> : null}
      </g>
      {visibleMarks.map((m) => {
        const c = outline.circles[m.index]!;
        // Above and to the right of its circle; flipped to the left or below where it would leave the box.
        const width = font * 0.62 * m.label.length; // JetBrains Mono advances about 0.6 em per character
        const left = c.x + c.r + 4 * px + width > view.minX + view.width;
        const p = toScreen({ x: left ? c.x - c.r - 4 * px : c.x + c.r + 4 * px, y: c.y + c.r + 2 * px });
        const y = p.y - font < view.minY ? toScreen({ x: 0, y: c.y - c.r }).y + font : p.y;
        return (
          <text key={m.index} x={p.x} y={y} fontSize={font} textAnchor={left ? 'end' : 'start'} className={`fill-accent-800 font-mono ${m.kind === 'primary' ? 'font-semibold' : ''}`}>
            {m.label}
          </text>
        );
      })}
      {origin ? (
        <>
          <text x={originArm + 4 * px} y={font * 0.35} fontSize={font} className="fill-accent-800 font-mono font-semibold">X</text>
          <text x={-font * 0.35} y={-originArm - 4 * px} fontSize={font} className="fill-accent-800 font-mono font-semibold">Y</text>
        </>
      ) : null}
    </svg>
  );
}

/** The local origin: crossed axes, each with an arrowhead on its + side. */
function OriginAxes({ at, arm }: { at: Point; arm: number }) {
  const head = arm * 0.28;
  const half = head * 0.45;
  const axes = `M${at.x - arm * 0.3} ${at.y}H${at.x + arm - head}M${at.x} ${at.y - arm * 0.3}V${at.y + arm - head}`;
  const heads = `M${at.x + arm} ${at.y}L${at.x + arm - head} ${at.y + half}L${at.x + arm - head} ${at.y - half}Z`
    + `M${at.x} ${at.y + arm}L${at.x - half} ${at.y + arm - head}L${at.x + half} ${at.y + arm - head}Z`;
  return (
    <g>
      <path d={axes} fill="none" className="stroke-accent-800" strokeWidth={2} vectorEffect="non-scaling-stroke" />
      <path d={heads} className="fill-accent-800" />
    </g>
  );
}
