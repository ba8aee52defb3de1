import { type INode, parse } from 'svgson';
import { describe, expect, it } from 'vitest';
import { type Drawing, emptyDrawing } from '../../server/dxf/drawing';
import { aciToHex, drawingToSvg } from '../../server/dxf/drawing-svg';

function all(node: INode, name: string): INode[] {
  const out: INode[] = node.name === name ? [node] : [];
  for (const c of node.children) out.push(...all(c, name));
  return out;
}

/** A 100 × 50 plate with a bulged corner, two holes, a slot arc, a datum point and a label. */
function plate(): Drawing {
  return {
    ...emptyDrawing('mm'),
    layers: [
      { name: 'OUTLINE', color: 1 },
      { name: 'HOLES', color: 3 },
      { name: 'NOTES', color: 7 },
    ],
    polylines: [
      {
        layer: 'OUTLINE',
        closed: true,
        vertices: [{ x: 0, y: 0 }, { x: 90, y: 0, bulge: Math.tan(Math.PI / 8) }, { x: 100, y: 10 }, { x: 100, y: 50 }, { x: 0, y: 50 }],
      },
    ],
    circles: [
      { layer: 'HOLES', center: { x: 20, y: 25 }, radius: 3 },
      { layer: 'HOLES', center: { x: 80, y: 25 }, radius: 3 },
    ],
    arcs: [{ layer: 'OUTLINE', center: { x: 50, y: 50 }, radius: 10, startAngle: 180, endAngle: 360 }],
    lines: [{ layer: 'OUTLINE', start: { x: 0, y: 0 }, end: { x: 10, y: 5 } }],
    points: [{ layer: 'HOLES', x: 50, y: 25 }],
    texts: [{ layer: 'NOTES', x: 5, y: 40, height: 4, text: 'M6 <thru> & "deep"' }],
  };
}

describe('drawingToSvg, parsed back with svgson', () => {
  it('has one group per layer holding the right number of elements', async () => {
    const svg = await parse(drawingToSvg(plate()));
    expect(svg.name).toBe('svg');
    const groups = svg.children.filter((c) => c.name === 'g');
    expect(groups.map((g) => g.attributes['data-layer'])).toEqual(['OUTLINE', 'HOLES', 'NOTES']);
    const count = (layer: string, name: string) => all(groups.find((g) => g.attributes['data-layer'] === layer)!, name).length;
    expect([count('OUTLINE', 'path'), count('OUTLINE', 'line')]).toEqual([2, 1]);
    expect(count('HOLES', 'circle')).toBe(3); // two holes and the point
    expect(count('NOTES', 'text')).toBe(1);
    expect(all(svg, 'path').length + all(svg, 'line').length + all(svg, 'circle').length + all(svg, 'text').length).toBe(7);
  });

  it('flips Y so +Y points up: drawing y becomes SVG −y, and the viewBox covers the drawing', async () => {
    const svg = await parse(drawingToSvg(plate(), { margin: 0 }));
    const line = all(svg, 'line')[0]!;
    expect([line.attributes.x1, line.attributes.y1, line.attributes.x2, line.attributes.y2]).toEqual(['0', '0', '10', '-5']);
    const holes = all(svg, 'circle').filter((c) => c.attributes.r === '3');
    expect(holes.map((c) => [c.attributes.cx, c.attributes.cy])).toEqual([['20', '-25'], ['80', '-25']]);
    // x from 0 to 100; y from 0 to 50 (the arc 180° → 360° about (50, 50) dips inside): top edge y = 50 → −50.
    expect(svg.attributes.viewBox).toBe('0 -50 100 50');
    expect(svg.attributes.width).toBe('800');
    expect(svg.attributes.height).toBe('400');
  });

  it('draws counter-clockwise arcs with sweep-flag 0 once Y is flipped, and closes closed polylines', async () => {
    const svg = await parse(drawingToSvg(plate()));
    const paths = all(svg, 'path').map((p) => p.attributes.d!);
    const outline = paths.find((d) => d.endsWith('Z'));
    const arc = paths.find((d) => !d.endsWith('Z'));
    // Corner: CCW quarter from (90, 0) to (100, 10), radius 10 (c(1 + b²)/4b with c = 10√2).
    expect(outline).toMatch(/^M 0 0 L 90 0 A 10 10 0 0 0 100 -10 L 100 -50 L 0 -50 Z$/);
    // Slot: CCW half circle 180° → 360° from (40, 50) to (60, 50), below the top edge.
    expect(arc).toBe('M 40 -50 A 10 10 0 0 0 60 -50');
    const cw = await parse(drawingToSvg({ ...emptyDrawing('mm'), polylines: [{ layer: '0', closed: false, vertices: [{ x: 0, y: 0, bulge: -1 }, { x: 2, y: 0 }] }] }));
    expect(all(cw, 'path')[0]!.attributes.d).toBe('M 0 0 A 1 1 0 0 1 2 0');
  });

  it('escapes text and keeps it upright (no mirroring transform anywhere)', async () => {
    const out = drawingToSvg(plate(), { title: 'Plate <A&B>' });
    expect(out).not.toContain('transform');
    const svg = await parse(out);
    const text = all(svg, 'text')[0]!;
    expect(text.children.map((c) => c.value).join('')).toBe('M6 <thru> & "deep"');
    expect([text.attributes.x, text.attributes.y, text.attributes['font-size']]).toEqual(['5', '-40', '4']);
    expect(all(svg, 'thru')).toEqual([]);
    expect(all(svg, 'title')[0]!.children[0]!.value).toBe('Plate <A&B>');
  });

  it('cannot be broken out of by text holding "]]>" twice (svgson splits only the first in its CDATA)', async () => {
    const evil = 'a]]>b]]><script>alert(1)</script>]]>';
    const out = drawingToSvg({ ...emptyDrawing('mm'), texts: [{ layer: '0', x: 0, y: 0, height: 1, text: evil }] });
    const svg = await parse(out);
    expect(all(svg, 'script')).toEqual([]);
    expect(all(svg, 'text')[0]!.children.map((c) => c.value).join('')).toBe(evil);
  });

  it('escapes layer names in attributes', async () => {
    const d = { ...emptyDrawing('in'), lines: [{ layer: 'A&B "x" <y>', start: { x: 0, y: 0 }, end: { x: 1, y: 1 } }] };
    const out = drawingToSvg(d);
    expect(out).toContain('data-layer="A&amp;B &quot;x&quot; &lt;y&gt;"');
    const svg = await parse(out);
    expect(all(svg, 'g')).toHaveLength(1);
    expect(all(svg, 'y')).toEqual([]);
  });

  it('scales the stroke width with the drawing: 1/400 of its larger side unless given', async () => {
    const small = await parse(drawingToSvg({ ...emptyDrawing('in'), lines: [{ layer: '0', start: { x: 0, y: 0 }, end: { x: 2, y: 1 } }] }));
    const large = await parse(drawingToSvg({ ...emptyDrawing('mm'), lines: [{ layer: '0', start: { x: 0, y: 0 }, end: { x: 400, y: 100 } }] }));
    expect(small.attributes['stroke-width']).toBe('0.005');
    expect(large.attributes['stroke-width']).toBe('1');
    const given = await parse(drawingToSvg(plate(), { strokeWidth: 0.35 }));
    expect(given.attributes['stroke-width']).toBe('0.35');
  });

  it('colours layers by ACI: 1 red, 3 green, 7 the foreground', async () => {
    const svg = await parse(drawingToSvg(plate(), { foreground: '#222222' }));
    expect(svg.children.filter((c) => c.name === 'g').map((g) => g.attributes.stroke)).toEqual(['#ff0000', '#00ff00', '#222222']);
  });

  it('writes a valid empty picture for an empty drawing', async () => {
    const svg = await parse(drawingToSvg(emptyDrawing('mm')));
    expect(svg.children).toEqual([]);
    expect(svg.attributes.viewBox).toMatch(/^[-\d. ]+$/);
  });
});

describe('aciToHex', () => {
  it.each([
    [1, '#ff0000'],
    [2, '#ffff00'],
    [3, '#00ff00'],
    [4, '#00ffff'],
    [5, '#0000ff'],
    [6, '#ff00ff'],
    [8, '#808080'],
    [250, '#333333'],
    [255, '#ffffff'],
    // ACI wheel: 10 is the full red of hue 0°, 50 hue 60° (yellow), 130 hue 180° (cyan), 170 hue 240° (blue); 12 a darker red.
    [10, '#ff0000'],
    [50, '#ffff00'],
    [130, '#00ffff'],
    [170, '#0000ff'],
    [12, '#cc0000'],
  ])('ACI %i → %s', (aci, hex) => {
    expect(aciToHex(aci)).toBe(hex);
  });

  it('gives the foreground for 7 and for values outside 1–255', () => {
    expect(aciToHex(7, '#123456')).toBe('#123456');
    expect(aciToHex(0, '#123456')).toBe('#123456');
    expect(aciToHex(256, '#123456')).toBe('#123456');
  });
});

describe('characters XML 1.0 cannot hold', () => {
  it('are left out of the picture (XML 1.0, §2.2 Char), so stored names from before the input check still draw', async () => {
    const d = plate();
    d.texts = [{ layer: 'NOTES', x: 5, y: 40, height: 4, text: 'Bracket\u0000 v\u00012 \u001b[31m\uffff \ud800end' }];
    const svg = drawingToSvg(d);
    // Char ::= #x9 | #xA | #xD | [#x20-#xD7FF] | [#xE000-#xFFFD] | [#x10000-#x10FFFF]
    const notChar = [...svg].filter((c) => {
      const cp = c.codePointAt(0)!;
      return !(cp === 0x9 || cp === 0xa || cp === 0xd || (cp >= 0x20 && cp <= 0xd7ff) || (cp >= 0xe000 && cp <= 0xfffd) || (cp >= 0x10000 && cp <= 0x10ffff));
    });
    expect(notChar).toEqual([]);
    const texts = all(await parse(svg), 'text').map((t) => t.children.map((c) => c.value).join(''));
    expect(texts).toContain('Bracket v2 [31m end');
  });
});
