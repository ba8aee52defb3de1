import { useId, useLayoutEffect, useRef, useState } from 'react';
import type { ClampModel } from '../../../../shared/schemas/catalog';
import type { Unit } from '../../../../shared/schemas/common';
import type { StockCheckReason } from '../../../../shared/schemas/stock-check';
import { formatLength, formatNumber } from '../../../../shared/units/units';
import { VERDICT_WORD, formatSettingShift, worstVerdict, type Verdict } from '../verdicts';
import { chartDomain, labelWidth, linearScale, offScale, placeLabels, stackRows, ticks, type OffScale } from '../window-chart-geometry';
import { VerdictShape, VerdictSwatch } from './verdict-mark';

export interface ChartInput {
  unit: Unit;
  nominalOpening: number;
  clamp: ClampModel;
  bars: { id: string; width: number; reasons: StockCheckReason[]; setting: number | null }[];
  settings: { shift: number; bars: string[] }[];
}

interface Mark { id: string; width: number; verdict: Verdict }
interface Lane { key: string; title: string; subtitle: string; subtitleMono: boolean; count: string; band: [number, number] | null; centre: number | null; marks: Mark[] }
interface PlacedMark extends Mark { off: OffScale; px: number; row: number; label: string }
interface LaneLayout { lane: Lane; top: number; height: number; bandH: number; marks: PlacedMark[] }

// Sizes in CSS px; the SVG is drawn at the width of its box, so text stays at its size on any screen.
const FONT = 14;
const LEFT = 168;
/** On a phone the lane titles get just their longest line ("Cannot be used"), leaving the rest to the scale. */
const NARROW_LEFT = 144;
const NARROW_BOX = 480;
const RIGHT = 24;
const TOP = 40;
/** Room above a lane's band for two rows of labels. */
const BAND_TOP = 44;
const MARK_R = 8;
/** Marks closer than this stack in rows inside the band. */
const MARK_PITCH = 2 * MARK_R + 3;
const MIN_BAND_H = 32;
const LANE_GAP = 12;
/** The lane title takes three lines at the left. */
const MIN_LANE_H = BAND_TOP + 56;
const BOTTOM = 60;
const LABEL_LEVELS = 2;

function useBoxWidth<T extends HTMLElement>(fallback: number) {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(fallback);
  useLayoutEffect(() => {
    const el = ref.current;
    if (!el) return;
    setWidth(el.clientWidth || fallback);
    const ro = new ResizeObserver((entries) => {
      const w = entries[0]?.contentRect.width;
      if (w) setWidth(w);
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, [fallback]);
  return [ref, width] as const;
}

/**
 * Bar widths against each setting's window: x is the measured width; each setting is a lane whose
 * band is [nominalOpening + shift − acceptBelow, nominalOpening + shift + acceptAbove] (the width
 * window only — the clamp-top and bite conditions are in the table). A setting's bars are
 * accepted on it; bars that no setting takes get a lane of their own, marked by their verdict
 * at shift 0. Every mark has a shape and a label, so color is never the only cue.
 */
export function WindowChart({ input }: { input: ChartInput }) {
  const [boxRef, boxWidth] = useBoxWidth<HTMLDivElement>(760);
  const titleId = useId();
  const descId = useId();
  const { unit, nominalOpening, clamp } = input;
  const byId = new Map(input.bars.map((b) => [b.id, b]));
  const plural = (n: number) => `${n} bar${n === 1 ? '' : 's'}`;

  const lanes: Lane[] = input.settings.map((s, k) => {
    const centre = nominalOpening + s.shift;
    return {
      key: `setting-${k}`,
      title: `Setting ${k + 1}`,
      subtitle: formatSettingShift(s.shift, unit),
      subtitleMono: true,
      count: plural(s.bars.length),
      band: [centre - clamp.acceptBelow, centre + clamp.acceptAbove],
      centre,
      marks: s.bars.map((id) => ({ id, width: byId.get(id)!.width, verdict: 'accepted' as const })),
    };
  });
  const unusable = input.bars.filter((b) => b.setting === null);
  if (unusable.length > 0) {
    lanes.push({
      key: 'unusable', title: 'Cannot be used', subtitle: 'on this rail', subtitleMono: false, count: plural(unusable.length), band: null, centre: null,
      marks: unusable.map((b) => ({ id: b.id, width: b.width, verdict: worstVerdict(b.reasons) })),
    });
  }

  // Never wider than its box (a 390 px phone leaves about 340 px): the lanes and ticks thin out instead.
  const width = Math.max(300, boxWidth);
  const plotL = width < NARROW_BOX ? NARROW_LEFT : LEFT;
  const plotR = width - RIGHT;
  const windows = lanes.flatMap((l) => (l.band ? [l.band] : []));
  // With nothing placeable, the nominal window stays on the scale so the marks have something to read against.
  if (windows.length === 0) windows.push([nominalOpening - clamp.acceptBelow, nominalOpening + clamp.acceptAbove]);
  const domain = chartDomain(windows, nominalOpening, input.bars.map((b) => b.width));
  const x = linearScale(domain, [plotL, plotR]);
  // As many ticks as their labels leave room for, and none whose label would run into its neighbour's.
  const tickText = (t: number) => formatNumber(t, unit);
  const tickRoom = labelWidth(tickText(domain[1]), FONT) + 16;
  const candidates = ticks(domain[0], domain[1], Math.max(2, Math.floor((plotR - plotL) / tickRoom)));
  const fits = placeLabels(candidates.map((t) => ({ x: x(t), width: labelWidth(tickText(t), FONT) })), 1, [0, width], 10);
  const tickValues = candidates.filter((t, i) => fits[i] !== null && fits[i]!.x === x(t));
  const nominalX = x(nominalOpening);

  // Lanes grow to hold their stacked marks, so bars of the same width stay visible side by side.
  let y = TOP;
  const layout: LaneLayout[] = [];
  for (const lane of lanes) {
    const base = lane.marks.map((m) => {
      const off = offScale(m.width, domain);
      const px = off === 'below' ? plotL + 10 : off === 'above' ? plotR - 10 : x(m.width);
      const label = off === null ? m.id : off === 'above' ? `${m.id} ${formatLength(m.width, unit)} →` : `← ${m.id} ${formatLength(m.width, unit)}`;
      return { ...m, off, px, label };
    });
    const rows = stackRows(base.map((m) => m.px), MARK_PITCH);
    const rowCount = rows.reduce((a, r) => Math.max(a, r + 1), 1);
    const bandH = Math.max(MIN_BAND_H, rowCount * MARK_PITCH + 8);
    const height = Math.max(MIN_LANE_H, BAND_TOP + bandH + LANE_GAP);
    const out = { lane, top: y, height, bandH, marks: base.map((m, i) => ({ ...m, row: rows[i]! })) };
    y += height;
    layout.push(out);
  }
  const plotBottom = y;
  const height = plotBottom + BOTTOM;

  const desc = lanes
    .map((l) => `${l.title}${l.band ? ` (shift ${l.subtitle}, window ${formatNumber(l.band[0], unit)} to ${formatLength(l.band[1], unit)})` : ' on this rail'}: ${l.marks.map((m) => `${m.id} ${formatLength(m.width, unit)}`).join(', ')}.`)
    .join(' ');
  const present = new Set(lanes.flatMap((l) => l.marks.map((m) => m.verdict)));
  const legendOrder: Verdict[] = ['accepted', 'too-narrow', 'too-wide', 'short-bite', 'clamp-above-carrier'];

  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="text-lg font-semibold">Bar widths against each setting's window</figcaption>
      <div ref={boxRef} className="w-full overflow-hidden rounded border border-slate-300 bg-white">
        <svg role="img" aria-labelledby={titleId} aria-describedby={descId} width={width} height={height} viewBox={`0 0 ${width} ${height}`} className="block font-sans" style={{ fontSize: FONT }}>
          <title id={titleId}>Measured bar widths against the window of each rail setting, in {unit}</title>
          <desc id={descId}>{desc}</desc>

          {/* grid and axis */}
          {tickValues.map((t) => (
            <line key={`g${t}`} x1={x(t)} x2={x(t)} y1={TOP - 6} y2={plotBottom} className="stroke-slate-200" />
          ))}
          <line x1={plotL} x2={plotR} y1={plotBottom} y2={plotBottom} className="stroke-slate-500" />
          {tickValues.map((t) => (
            <g key={`t${t}`}>
              <line x1={x(t)} x2={x(t)} y1={plotBottom} y2={plotBottom + 6} className="stroke-slate-500" />
              <text x={x(t)} y={plotBottom + 22} textAnchor="middle" className="fill-slate-800 font-mono">{tickText(t)}</text>
            </g>
          ))}
          <text x={(plotL + plotR) / 2} y={height - 10} textAnchor="middle" className="fill-slate-900 font-semibold">Measured bar width ({unit})</text>

          {/* nominal opening */}
          <line x1={nominalX} x2={nominalX} y1={TOP - 8} y2={plotBottom} strokeDasharray="6 4" className="stroke-slate-600 stroke-[1.5]" />
          <text x={nominalX} y={TOP - 14} textAnchor={nominalX > plotR - 120 ? 'end' : nominalX < plotL + 120 ? 'start' : 'middle'} className="fill-slate-800">
            nominal opening <tspan className="font-mono">{formatLength(nominalOpening, unit)}</tspan>
          </text>

          {layout.map((l, i) => (
            <LaneView key={l.lane.key} layout={l} x={x} plot={[plotL, plotR]} unit={unit} shaded={i % 2 === 1} />
          ))}
        </svg>
      </div>
      <ul aria-label="Chart legend" className="flex flex-wrap gap-x-5 gap-y-1 text-base text-slate-800">
        {legendOrder.filter((v) => present.has(v)).map((v) => (
          <li key={v} className="inline-flex items-center gap-1.5">
            <VerdictSwatch verdict={v} />
            {v === 'accepted' ? 'accepted on this setting' : VERDICT_WORD[v]}
          </li>
        ))}
        <li className="inline-flex items-center gap-1.5">
          <svg aria-hidden width="28" height="18"><rect x="1" y="2" width="26" height="14" className="fill-accent-100 stroke-accent-700" /></svg>
          setting's width window (−{formatNumber(clamp.acceptBelow, unit)} / +{formatLength(clamp.acceptAbove, unit)})
        </li>
        <li className="inline-flex items-center gap-1.5">
          <svg aria-hidden width="18" height="18"><line x1="9" x2="9" y1="0" y2="18" strokeDasharray="4 3" className="stroke-slate-600 stroke-[1.5]" /></svg>
          nominal opening
        </li>
      </ul>
    </figure>
  );
}

function LaneView({ layout, x, plot, unit, shaded }: { layout: LaneLayout; x: (v: number) => number; plot: [number, number]; unit: Unit; shaded: boolean }) {
  const { lane, top, height, bandH, marks } = layout;
  const bandTop = top + BAND_TOP;
  // Labels above the band belong to the top row of marks (a leader line to a stacked mark would point at the wrong one).
  const top0 = marks.map((m, i) => ({ m, i })).filter(({ m }) => m.row === 0);
  const placedTop = placeLabels(top0.map(({ m }) => ({ x: m.px, width: labelWidth(m.label, FONT) })), LABEL_LEVELS, plot);
  const placed = marks.map(() => null as ReturnType<typeof placeLabels>[number]);
  top0.forEach(({ i }, k) => { placed[i] = placedTop[k] ?? null; });
  // A mark with no room above (a stacked one, mostly) is labelled on its right when its row is free there.
  const beside = marks.map((m, i) => {
    if (placed[i]) return false;
    const next = marks.reduce((nx, o) => (o !== m && o.row === m.row && o.px > m.px ? Math.min(nx, o.px - MARK_R) : nx), plot[1] + RIGHT);
    return m.px + MARK_R + 4 + labelWidth(m.label, FONT) <= next - 2;
  });
  return (
    <g>
      {shaded ? <rect x={0} y={top} width={plot[1] + RIGHT} height={height} className="fill-slate-50" /> : null}
      <text x={12} y={bandTop + 8} className="fill-slate-900 font-semibold" style={{ fontSize: 15 }}>{lane.title}</text>
      <text x={12} y={bandTop + 26} className={`fill-slate-800 ${lane.subtitleMono ? 'font-mono' : ''}`}>{lane.subtitle}</text>
      <text x={12} y={bandTop + 44} className="fill-slate-700">{lane.count}</text>
      {lane.band ? (
        <g>
          <rect x={x(lane.band[0])} y={bandTop} width={Math.max(1, x(lane.band[1]) - x(lane.band[0]))} height={bandH} className="fill-accent-100 stroke-accent-700" />
          <line x1={x(lane.centre!)} x2={x(lane.centre!)} y1={bandTop} y2={bandTop + bandH} className="stroke-accent-700" strokeDasharray="2 3" />
        </g>
      ) : null}
      {marks.map((m, i) => {
        const p = placed[i];
        const labelY = bandTop - 8 - (p?.level ?? 0) * 18;
        const markY = bandTop + 4 + MARK_PITCH / 2 + m.row * MARK_PITCH;
        return (
          <g key={m.id}>
            <title>{`${m.id}: ${formatLength(m.width, unit)} — ${m.verdict === 'accepted' ? `accepted on ${lane.title.toLowerCase()}` : VERDICT_WORD[m.verdict]}`}</title>
            {p ? (
              <>
                <line x1={m.px} x2={p.x} y1={bandTop - 1} y2={labelY + 4} className="stroke-slate-400" />
                <text x={p.x} y={labelY} textAnchor="middle" className="fill-slate-900 font-mono">{m.label}</text>
              </>
            ) : beside[i] ? (
              <text x={m.px + MARK_R + 4} y={markY + 5} className="fill-slate-900 font-mono">{m.label}</text>
            ) : null}
            <VerdictShape verdict={m.verdict} x={m.px} y={markY} r={MARK_R} />
          </g>
        );
      })}
    </g>
  );
}
