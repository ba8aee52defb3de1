import { type INode, stringify } from 'svgson';
import { bulgeRadius, bulgeSweep } from '../../shared/geometry/bulge';
import { addArcExtents, addBulgeExtents, Extents } from '../../shared/geometry/extents';
import type { Drawing } from './drawing';

export interface DrawingSvgOptions {
  /** Width of the picture in CSS pixels; the height follows the drawing's proportions. Default 800. */
  widthPx?: number;
  /** Empty border around the drawing, as a fraction of its larger side. Default 0.04. */
  margin?: number;
  /** Line width in drawing units. Default: 1/400 of the drawing's larger side. */
  strokeWidth?: number;
  /** Colour for ACI 7, which means black on a light background. Default '#000000'. */
  foreground?: string;
  /** Fill the background with this colour; none by default. */
  background?: string;
  /** Text of a <title> element, for accessibility. */
  title?: string;
}

const DEG = Math.PI / 180;

/**
 * RGB of an AutoCAD Color Index, for a preview. 1–6 are the named colours and 7 the foreground;
 * 8, 9 and the greys 250–255 take common table values; 10–249 follow the layout of the ACI
 * wheel (24 hues 15° apart; five shades at 100, 80, 60, 50 and 30 % value; even indexes fully
 * saturated, odd ones half). Published ACI tables differ in the shades, so these are approximate.
 */
export function aciToHex(aci: number, foreground = '#000000'): string {
  const fixed: Record<number, string> = {
    1: '#ff0000',
    2: '#ffff00',
    3: '#00ff00',
    4: '#00ffff',
    5: '#0000ff',
    6: '#ff00ff',
    8: '#808080',
    9: '#c0c0c0',
    250: '#333333',
    251: '#505050',
    252: '#696969',
    253: '#828282',
    254: '#bebebe',
    255: '#ffffff',
  };
  if (aci === 7 || !Number.isInteger(aci) || aci < 1 || aci > 255) return foreground;
  const known = fixed[aci];
  if (known) return known;
  const hue = (Math.floor(aci / 10) - 1) * 15;
  const row = aci % 10;
  const value = [1, 0.8, 0.6, 0.5, 0.3][Math.floor(row / 2)]!;
  const saturation = row % 2 === 0 ? 1 : 0.5;
  // HSV → RGB
  const c = value * saturation;
  const x = c * (1 - Math.abs(((hue / 60) % 2) - 1));
  const m = value - c;
  const [r, g, b] =
    hue < 60 ? [c, x, 0] : hue < 120 ? [x, c, 0] : hue < 180 ? [0, c, x] : hue < 240 ? [0, x, c] : hue < 300 ? [x, 0, c] : [c, 0, x];
  const hex = (v: number): string => Math.round((v + m) * 255).toString(16).padStart(2, '0');
  return `#${hex(r)}${hex(g)}${hex(b)}`;
}

function element(name: string, attributes: Record<string, string>, children: INode[] = []): INode {
  return { name, type: 'element', value: '', attributes, children };
}

/**
 * Text content as svgson text nodes. svgson 5.3.1 wraps text holding & < or > in CDATA but splits
 * only the first "]]>" inside it (a non-global replace), so a second "]]>" would end the CDATA
 * section and let the rest be read as markup. Cutting the text between "]]" and ">" leaves no
 * node with "]]>" in it, and the nodes written one after another read back as the same text.
 */
function textNodes(value: string): INode[] {
  const parts = value.split(']]>');
  return parts.map((part, i) => ({
    name: '',
    type: 'text',
    value: `${i > 0 ? '>' : ''}${part}${i < parts.length - 1 ? ']]' : ''}`,
    attributes: {},
    children: [],
  }));
}

/** Extents of everything in the drawing; texts are boxed roughly (0.6 × height per character). */
function drawingExtents(d: Drawing): Extents {
  const ext = new Extents();
  for (const l of d.lines) {
    ext.add(l.start.x, l.start.y);
    ext.add(l.end.x, l.end.y);
  }
  for (const a of d.arcs) {
    const sweep = arcSweepDeg(a.startAngle, a.endAngle) * DEG;
    addArcExtents(ext, a.center.x, a.center.y, a.radius, 0, 0, a.radius, a.startAngle * DEG, sweep);
  }
  for (const c of d.circles) {
    ext.add(c.center.x - c.radius, c.center.y - c.radius);
    ext.add(c.center.x + c.radius, c.center.y + c.radius);
  }
  for (const p of d.polylines) {
    const n = p.vertices.length;
    for (let i = 0; i < n; i++) {
      const v = p.vertices[i]!;
      const w = p.vertices[(i + 1) % n]!;
      if (v.bulge && (p.closed || i < n - 1)) addBulgeExtents(ext, v.x, v.y, w.x, w.y, v.bulge);
      else ext.add(v.x, v.y);
    }
  }
  for (const p of d.points) ext.add(p.x, p.y);
  for (const t of d.texts) {
    ext.add(t.x, t.y);
    ext.add(t.x + 0.6 * t.height * t.text.length, t.y + t.height);
  }
  return ext;
}

/** C0 controls other than tab and line breaks, U+FFFE/U+FFFF and lone surrogates: not XML 1.0 characters. */
const NOT_XML_CHAR = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/g;

/** Counter-clockwise sweep from start to end, in degrees, in (0, 360]. */
function arcSweepDeg(start: number, end: number): number {
  const s = (((end - start) % 360) + 360) % 360;
  return s === 0 ? 360 : s;
}

/**
 * The drawing as an SVG picture seen from above with +Y up (ISO 841: the XY plane viewed from +Z),
 * one <g> per layer in the layer's colour. SVG's y axis points down, so every y is negated; text
 * stays upright because no mirroring transform is used. Built as an element tree and written
 * by svgson, which escapes text and attribute values.
 */
export function drawingToSvg(drawing: Drawing, options: DrawingSvgOptions = {}): string {
  const ext = drawingExtents(drawing);
  const empty = ext.empty;
  const minX = empty ? 0 : ext.minX;
  const minY = empty ? 0 : ext.minY;
  const w = empty ? 1 : ext.maxX - ext.minX;
  const h = empty ? 1 : ext.maxY - ext.minY;
  const size = Math.max(w, h, 1e-9);
  const margin = (options.margin ?? 0.04) * size;
  const vbW = Math.max(w, size * 1e-3) + 2 * margin;
  const vbH = Math.max(h, size * 1e-3) + 2 * margin;
  const widthPx = options.widthPx ?? 800;
  const heightPx = (widthPx * vbH) / vbW;
  const stroke = options.strokeWidth ?? size / 400;
  const foreground = options.foreground ?? '#000000';

  // Coordinates to about 1/100,000 of the drawing size: plenty for a picture, and short.
  const digits = Math.max(0, Math.min(12, Math.ceil(5 - Math.log10(size))));
  const f = (v: number): string => {
    const s = v.toFixed(digits);
    const t = digits > 0 ? s.replace(/\.?0+$/, '') : s;
    return t === '-0' ? '0' : t;
  };
  const X = (x: number): string => f(x);
  const Y = (y: number): string => f(-y);

  const colors = new Map<string, string>();
  for (const l of drawing.layers) colors.set(l.name, aciToHex(l.color, foreground));
  const groups = new Map<string, INode[]>();
  const into = (layer: string): INode[] => {
    let g = groups.get(layer);
    if (!g) {
      g = [];
      groups.set(layer, g);
    }
    return g;
  };

  // An SVG arc flag pair for a counter-clockwise (in drawing terms) sweep: after y is negated a
  // counter-clockwise arc runs in SVG's negative-angle direction, so sweep-flag = 0.
  const arcTo = (r: number, sweepRad: number, x: number, y: number): string => {
    const large = Math.abs(sweepRad) > Math.PI ? 1 : 0;
    const flag = sweepRad > 0 ? 0 : 1;
    return `A ${f(r)} ${f(r)} 0 ${large} ${flag} ${X(x)} ${Y(y)}`;
  };

  for (const l of drawing.lines) {
    into(l.layer).push(element('line', { x1: X(l.start.x), y1: Y(l.start.y), x2: X(l.end.x), y2: Y(l.end.y) }));
  }
  for (const a of drawing.arcs) {
    const sweep = arcSweepDeg(a.startAngle, a.endAngle);
    if (sweep === 360) {
      into(a.layer).push(element('circle', { cx: X(a.center.x), cy: Y(a.center.y), r: f(a.radius) }));
      continue;
    }
    const s = a.startAngle * DEG;
    const e = s + sweep * DEG;
    const x0 = a.center.x + a.radius * Math.cos(s);
    const y0 = a.center.y + a.radius * Math.sin(s);
    const x1 = a.center.x + a.radius * Math.cos(e);
    const y1 = a.center.y + a.radius * Math.sin(e);
    into(a.layer).push(element('path', { d: `M ${X(x0)} ${Y(y0)} ${arcTo(a.radius, sweep * DEG, x1, y1)}` }));
  }
  for (const c of drawing.circles) {
    into(c.layer).push(element('circle', { cx: X(c.center.x), cy: Y(c.center.y), r: f(c.radius) }));
  }
  for (const p of drawing.polylines) {
    const v = p.vertices;
    const n = v.length;
    const parts = [`M ${X(v[0]!.x)} ${Y(v[0]!.y)}`];
    const segments = p.closed ? n : n - 1;
    for (let i = 0; i < segments; i++) {
      const a = v[i]!;
      const b = v[(i + 1) % n]!;
      const bulge = a.bulge ?? 0;
      if (bulge === 0 || (a.x === b.x && a.y === b.y)) {
        if (!(p.closed && i === n - 1)) parts.push(`L ${X(b.x)} ${Y(b.y)}`);
        continue;
      }
      // Radius and signed included angle of the bulge (DXF Reference, LWPOLYLINE group 42).
      const r = bulgeRadius(Math.hypot(b.x - a.x, b.y - a.y), bulge);
      parts.push(arcTo(r, bulgeSweep(bulge), b.x, b.y));
    }
    if (p.closed) parts.push('Z');
    into(p.layer).push(element('path', { d: parts.join(' ') }));
  }
  for (const p of drawing.points) {
    into(p.layer).push(element('circle', { class: 'point', cx: X(p.x), cy: Y(p.y), r: f(stroke * 1.5), stroke: 'none', fill: 'currentColor' }));
  }
  for (const t of drawing.texts) {
    into(t.layer).push(
      element('text', { x: X(t.x), y: Y(t.y), 'font-size': f(t.height), stroke: 'none', fill: 'currentColor' }, textNodes(t.text)),
    );
  }

  const children: INode[] = [];
  if (options.title) children.push(element('title', {}, textNodes(options.title)));
  if (options.background) {
    children.push(element('rect', { x: f(minX - margin), y: f(-(minY + h) - margin), width: f(vbW), height: f(vbH), fill: options.background, stroke: 'none' }));
  }
  const order = [...drawing.layers.map((l) => l.name), ...[...groups.keys()].filter((k) => !colors.has(k))];
  for (const name of new Set(order)) {
    const items = groups.get(name);
    if (!items) continue;
    const color = colors.get(name) ?? foreground;
    children.push(element('g', { 'data-layer': name, stroke: color, color }, items));
  }

  const svg = element(
    'svg',
    {
      xmlns: 'http://www.w3.org/2000/svg',
      viewBox: `${f(minX - margin)} ${f(-(minY + h) - margin)} ${f(vbW)} ${f(vbH)}`,
      width: String(Math.round(widthPx * 100) / 100),
      height: String(Math.round(heightPx * 100) / 100),
      fill: 'none',
      'stroke-width': f(stroke),
      'stroke-linecap': 'round',
      'stroke-linejoin': 'round',
      'font-family': 'sans-serif',
    },
    children,
  );
  // Input refuses control characters; names stored before that was so are cleaned here, since
  // XML 1.0 (§2.2 Char) has no place for them and a browser refuses the whole picture.
  return stringify(svg).replace(NOT_XML_CHAR, '');
}
