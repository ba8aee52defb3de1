/**
 * dxf-writer 1.18.4, typed from its source. Gridset imports the class file itself
 * ('dxf-writer/src/Drawing.js', which the package's index.js re-exports unchanged) because the
 * package's bundled index.d.ts declares vertices of drawPolyline as [x, y] only, while
 * src/Polyline.js writes a third element as the bulge (group 42), and it declares named classes
 * that index.js does not export. An ambient 'dxf-writer' declaration here would not take effect:
 * TypeScript resolves the bare name to the bundled file first.
 */
declare module 'dxf-writer/src/Drawing.js' {
  /** [x, y], or [x, y, bulge] — src/Polyline.js writes the third element as group 42. */
  export type PolylineVertex = [number, number] | [number, number, number];
  /** [group code, value] pairs of a header variable. */
  export type HeaderValue = [number, number | string];
  export type UnitName =
    | 'Unitless'
    | 'Inches'
    | 'Feet'
    | 'Miles'
    | 'Millimeters'
    | 'Centimeters'
    | 'Meters'
    | 'Kilometers'
    | 'Microinches'
    | 'Mils'
    | 'Yards'
    | 'Angstroms'
    | 'Nanometers'
    | 'Microns'
    | 'Decimeters'
    | 'Decameters'
    | 'Hectometers'
    | 'Gigameters'
    | 'Astronomical units'
    | 'Light years'
    | 'Parsecs';
  export type HorizontalAlignment = 'left' | 'center' | 'right';
  export type VerticalAlignment = 'baseline' | 'bottom' | 'middle' | 'top';

  export default class Drawing {
    constructor();
    /** $INSUNITS codes by name (DXF Reference, HEADER section). */
    static readonly UNITS: Readonly<Record<UnitName, number>>;
    static readonly ACI: Readonly<Record<'LAYER' | 'RED' | 'YELLOW' | 'GREEN' | 'CYAN' | 'BLUE' | 'MAGENTA' | 'WHITE', number>>;
    /** Header variables without the leading $, as written by toDxfString. */
    headers: Record<string, HeaderValue[]>;
    addLineType(name: string, description: string, elements: number[]): this;
    /** colorNumber: AutoCAD Color Index 1–255. */
    addLayer(name: string, colorNumber: number, lineTypeName?: string | null): this;
    setActiveLayer(name: string): this;
    drawLine(x1: number, y1: number, x2: number, y2: number): this;
    drawPoint(x: number, y: number): this;
    /** Angles in degrees, counter-clockwise (ARC groups 50 and 51). */
    drawArc(x: number, y: number, r: number, startAngle: number, endAngle: number): this;
    drawCircle(x: number, y: number, r: number): this;
    drawText(
      x: number,
      y: number,
      height: number,
      rotation: number,
      value: string,
      horizontalAlignment?: HorizontalAlignment,
      verticalAlignment?: VerticalAlignment,
    ): this;
    /** Written as an LWPOLYLINE: 90 vertex count, 70 closed flag, then 10/20 (and 42) per vertex. */
    drawPolyline(points: PolylineVertex[], closed?: boolean, startWidth?: number, endWidth?: number): this;
    /** Sets header variable $name; values are [group code, value] pairs. */
    header(variable: string, values: HeaderValue[]): this;
    /** Sets $INSUNITS (group 70). */
    setUnits(unit: UnitName): this;
    toDxfString(): string;
  }
}
