import DxfParser from 'dxf-parser';
import { describe, expect, it } from 'vitest';
import { inspectDxf } from '../../server/dxf/read-dxf';
import { generateLargeDxf } from '../bench/generate-dxf';

describe('generateLargeDxf (the benchmark input)', () => {
  const text = generateLargeDxf(300_000);

  it('comes close to the size asked for, about 100 bytes an entity, and is the same every time', () => {
    expect(text.length).toBeGreaterThan(290_000);
    expect(text.length).toBeLessThanOrEqual(300_000);
    expect(generateLargeDxf(300_000)).toBe(text);
    const entities = new DxfParser().parse(text)!.entities.length;
    expect(text.length / entities).toBeGreaterThan(70);
    expect(text.length / entities).toBeLessThan(130);
  });

  it('is a drawing inspectDxf reads whole: millimetres, blocks, curves, nothing unsupported', () => {
    const r = inspectDxf(text);
    expect(r.unit).toBe('mm');
    expect(r.unsupported).toEqual([]);
    expect(r.warnings).toEqual([]);
    expect(r.entityTypes.map((t) => t.type)).toEqual(['ARC', 'CIRCLE', 'ELLIPSE', 'INSERT', 'LINE', 'LWPOLYLINE', 'POINT', 'SPLINE', 'TEXT']);
    const inserts = r.entityTypes.find((t) => t.type === 'INSERT')!.count;
    // Each INSERT of block CLAMP adds two circles and a line in place of itself.
    expect(r.expandedEntities).toBe(r.entities + 2 * inserts);
    expect(r.layers.map((l) => l.name)).toEqual(['HOLES', 'NOTES', 'OUTLINE']);
  });
});
