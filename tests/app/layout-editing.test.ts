// The layout editor's pure parts: the undo history, the label layout and the check a drag asks.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { z } from 'zod';
import { TemplateContentSchema, type TemplateContent } from '../../shared/schemas/template';
import { HISTORY_LIMIT, historyReducer, startHistory, type History } from '../../app/features/templates/layout-history';
import { labelBox, layoutLabels, MONO_ADVANCE, type LabelRequest } from '../../app/features/templates/components/plate-drawing-label-layout';
import { moveRefusal } from '../../app/features/templates/placement-moves';

describe('undo history', () => {
  // The history pattern (Redux documentation, "Implementing Undo History"): an edit pushes the
  // present onto the past and clears the future; undo and redo move one step between them.
  const edit = (h: History<number>, v: number, tag?: string) => historyReducer(h, { type: 'edit', next: () => v, ...(tag ? { tag } : {}) });

  it('undo restores each earlier state in turn and redo re-applies them', () => {
    let h = startHistory(0);
    for (const v of [1, 2, 3]) h = edit(h, v);
    h = historyReducer(h, { type: 'undo' });
    expect(h.present).toBe(2);
    h = historyReducer(h, { type: 'undo' });
    expect(h.present).toBe(1);
    h = historyReducer(h, { type: 'redo' });
    expect(h.present).toBe(2);
    h = historyReducer(h, { type: 'redo' });
    expect(h.present).toBe(3);
    expect(historyReducer(h, { type: 'redo' })).toBe(h); // nothing to redo
  });

  it('a new edit after an undo drops the undone future', () => {
    let h = edit(edit(startHistory(0), 1), 2);
    h = historyReducer(h, { type: 'undo' });
    h = edit(h, 5);
    expect(h.future).toEqual([]);
    expect(historyReducer(h, { type: 'undo' }).present).toBe(1);
  });

  it('edits that change nothing leave no step; a run of one tag is one step', () => {
    const h0 = startHistory(0);
    expect(edit(h0, 0)).toBe(h0);
    let h = edit(h0, 1, 'name');
    h = edit(h, 2, 'name');
    h = edit(h, 3, 'name');
    expect(h.past).toEqual([0]);
    expect(historyReducer(h, { type: 'undo' }).present).toBe(0);
  });

  it('any sequence of edits is undone back to the start, and redone to the end (property)', () => {
    fc.assert(fc.property(fc.array(fc.integer({ min: 1, max: 1000 }), { minLength: 1, maxLength: 50 }), (values) => {
      let h = startHistory(0);
      for (const v of values) h = historyReducer(h, { type: 'edit', next: (p) => p + v });
      const end = h.present;
      for (let i = 0; i < values.length; i++) h = historyReducer(h, { type: 'undo' });
      expect(h.present).toBe(0);
      for (let i = 0; i < values.length; i++) h = historyReducer(h, { type: 'redo' });
      expect(h.present).toBe(end);
      expect(end).toBe(values.reduce((a, b) => a + b, 0));
    }));
  });

  it(`keeps at most ${HISTORY_LIMIT} steps back`, () => {
    let h = startHistory(0);
    for (let v = 1; v <= HISTORY_LIMIT + 50; v++) h = edit(h, v);
    expect(h.past).toHaveLength(HISTORY_LIMIT);
    expect(h.past[0]).toBe(50);
  });
});

describe('label layout', () => {
  const box = { minX: 0, minY: 0, maxX: 20, maxY: 10 };
  const request = (key: string, x: number, y: number, text = 'CR-8', size = 0.5): LabelRequest => ({
    key, text, at: { x, y }, size, vertical: false, bounds: { minX: x - 1, minY: y - 0.2, maxX: x + 1, maxY: y + 0.2 },
  });
  // Two axis-aligned boxes overlap exactly when their extents overlap on both axes (the
  // separating axis theorem for boxes; touching edges do not count).
  const overlap = (a: { minX: number; maxX: number; minY: number; maxY: number }, b: typeof a) =>
    Math.min(a.maxX, b.maxX) - Math.max(a.minX, b.minX) > 1e-9 && Math.min(a.maxY, b.maxY) - Math.max(a.minY, b.minY) > 1e-9;

  it('a monospaced label is as wide as its characters', () => {
    // 4 characters at 0.6 em (JetBrains Mono's advance, from memory) and 10 units: 24 units of glyphs.
    const b = labelBox('CR-8', 0, 0, 10, false);
    expect(b.maxX - b.minX).toBeCloseTo(4 * MONO_ADVANCE * 10 + 2 * 0.11 * 10, 9);
    const v = labelBox('CR-8', 0, 0, 10, true);
    expect(v.maxY - v.minY).toBeCloseTo(b.maxX - b.minX, 9);
  });

  it('a label at the edge is pushed inside the drawing box', () => {
    const placed = layoutLabels([request('a', 19.9, 9.9)], box).get('a')!;
    expect(placed.box.maxX).toBeLessThanOrEqual(box.maxX + 1e-9);
    expect(placed.box.maxY).toBeLessThanOrEqual(box.maxY + 1e-9);
  });

  it('two labels on one spot do not pile up: the second moves beside, or is left out', () => {
    const placed = layoutLabels([request('a', 10, 5), request('b', 10, 5)], box);
    const a = placed.get('a')!;
    const b = placed.get('b');
    expect(a.x).toBe(10);
    if (b) expect(overlap(a.box, b.box)).toBe(false);
  });

  it('a label that fits nowhere is left out', () => {
    const tiny = { minX: 0, minY: 0, maxX: 1, maxY: 1 };
    expect(layoutLabels([request('a', 0.5, 0.5, 'A-LONG-CODE')], tiny).size).toBe(0);
  });

  it('whatever the requests, every placed label is inside the box and none overlap (property)', () => {
    const req = fc.record({
      x: fc.double({ min: -5, max: 25, noNaN: true }),
      y: fc.double({ min: -5, max: 15, noNaN: true }),
      text: fc.constantFrom('A', 'CR-8', 'JR-1.500', 'SR-4'),
      size: fc.double({ min: 0.2, max: 1.5, noNaN: true }),
      vertical: fc.boolean(),
    });
    fc.assert(fc.property(fc.array(req, { maxLength: 60 }), fc.array(fc.record({ x: fc.double({ min: 0, max: 20, noNaN: true }), y: fc.double({ min: 0, max: 10, noNaN: true }) }), { maxLength: 10 }), (reqs, obs) => {
      const requests = reqs.map((r, i) => ({ ...request(String(i), r.x, r.y, r.text, r.size), vertical: r.vertical }));
      const obstacles = obs.map((o) => ({ minX: o.x - 0.3, minY: o.y - 0.3, maxX: o.x + 0.3, maxY: o.y + 0.3 }));
      const placed = [...layoutLabels(requests, box, obstacles).values()];
      for (const p of placed) {
        expect(p.box.minX).toBeGreaterThanOrEqual(box.minX - 1e-9);
        expect(p.box.maxX).toBeLessThanOrEqual(box.maxX + 1e-9);
        expect(p.box.minY).toBeGreaterThanOrEqual(box.minY - 1e-9);
        expect(p.box.maxY).toBeLessThanOrEqual(box.maxY + 1e-9);
        for (const o of obstacles) expect(overlap(p.box, o)).toBe(false);
      }
      for (let i = 0; i < placed.length; i++) for (let j = i + 1; j < placed.length; j++) expect(overlap(placed[i]!.box, placed[j]!.box)).toBe(false);
    }));
  });
});

describe('where a drag may drop a placement', () => {
  // A 1 × 0.5 in block on one dowel and a 2-dowel rail 4 in long, on a 2 in grid of 8 × 6 holes
  // (edge 1 in beyond the outer holes). Overlap and plate edge are plain box arithmetic here.
  const block = {
    code: 'BK', kind: 'stop' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }], stops: [{ x: 0.25, y: 0 }],
    outline: { paths: [{ closed: true, points: [{ x: -0.5, y: -0.25 }, { x: 0.5, y: -0.25 }, { x: 0.5, y: 0.25 }, { x: -0.5, y: 0.25 }] }], circles: [] },
  };
  const rail = {
    code: 'RL', kind: 'center-rail' as const, unit: 'in' as const, dowels: [{ x: 0, y: 0 }, { x: 4, y: 0 }], stops: [{ x: 1, y: 0.25 }], jawFaces: [{ x: 0, y: 0.25, normal: 90 }],
    outline: { paths: [{ closed: true, points: [{ x: -0.5, y: -0.25 }, { x: 4.5, y: -0.25 }, { x: 4.5, y: 0.25 }, { x: -0.5, y: 0.25 }] }], circles: [] },
  };
  const content: TemplateContent = TemplateContentSchema.parse({
    name: 'Drag test', unit: 'in',
    plate: { code: 'P', unit: 'in', pitch: 2, columns: 8, rows: 6 },
    components: [block, rail],
    placements: [
      { id: 'R', component: 'RL', hole: { col: 1, row: 1 }, rotation: 0, stopsInUse: [0] },
      { id: 'B', component: 'BK', hole: { col: 5, row: 4 }, rotation: 0, stopsInUse: [0] },
    ],
    sharedOffset: { kind: 'hole', hole: { col: 0, row: 0 } },
  } satisfies z.input<typeof TemplateContentSchema>);

  it('a free hole is allowed', () => {
    expect(moveRefusal(content, 'B', { col: 6, row: 5 })).toBeNull();
  });

  it('a hole under the rail is refused in words, naming it', () => {
    // The rail spans x −1 … 6.5 in along row 1 (y 1.75 … 2.25 in); hole (2, 1) is (4, 2) in: inside it.
    const why = moveRefusal(content, 'B', { col: 2, row: 1 });
    expect(why).toMatch(/^B cannot go on hole \(2, 1\): /);
    expect(why).toContain('overlaps R');
  });

  it('a hole off the plate is refused', () => {
    // Holes run 0 … 7 by 0 … 5: column 8 does not exist.
    expect(moveRefusal(content, 'B', { col: 8, row: 4 })).toContain('off the plate');
  });

  it('the rail moved so its second dowel leaves the grid is refused', () => {
    // Its second dowel is 4 in (2 holes) along +X: from column 6 it would need column 8.
    expect(moveRefusal(content, 'R', { col: 6, row: 1 })).toMatch(/dowel off the plate|off the plate/);
  });
});
