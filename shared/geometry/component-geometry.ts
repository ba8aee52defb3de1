import type { Point, Unit } from '../schemas/common';
import type { Outline } from '../schemas/geometry';
import type { JawFace, Stop } from '../schemas/catalog';
import type { TemplateComponent } from '../schemas/template';
import { convert } from '../units/units';

/** The parts of a component the station engine needs, in one length unit. */
export interface ComponentGeometry {
  dowels: Point[];
  stops: Stop[];
  jawFaces: JawFace[];
  outline: Outline | null;
}

/**
 * A component's geometry in another unit. Lengths scale; angles (stop angle, face normal) and
 * bulges (tan of a quarter of the included angle, unitless) do not.
 */
export function componentGeometryIn(component: Pick<TemplateComponent, 'unit' | 'dowels' | 'stops' | 'jawFaces' | 'outline'>, unit: Unit): ComponentGeometry {
  const from = component.unit;
  const len = (v: number) => convert(v, from, unit);
  return {
    dowels: component.dowels.map((d) => ({ x: len(d.x), y: len(d.y) })),
    stops: (component.stops ?? []).map((s) => ({ ...s, x: len(s.x), y: len(s.y), ...(s.z === undefined ? {} : { z: len(s.z) }) })),
    jawFaces: (component.jawFaces ?? []).map((f) => ({ ...f, x: len(f.x), y: len(f.y) })),
    outline: component.outline
      ? {
          paths: component.outline.paths.map((p) => ({ ...p, points: p.points.map((v) => ({ ...v, x: len(v.x), y: len(v.y) })) })),
          circles: component.outline.circles.map((c) => ({ ...c, x: len(c.x), y: len(c.y), r: len(c.r) })),
        }
      : null,
  };
}
