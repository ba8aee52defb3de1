/**
 * Every size, count and coordinate a user can send is bounded before any loop runs on it. The
 * limits are far past anything a machine shop meets (the largest machining-center tables are a
 * few metres long; a fixture plate holds a few hundred stations), so only a damaged or hostile
 * input reaches them. README.md, "Input limits", lists them in a table; keep the two in step.
 */
export const LIMITS = {
  /** |x|, |y|, |z| of any coordinate, radius, length or offset, in the object's own unit (100 m in mm). */
  coordinate: 100_000,
  /** The same bound for a DXF drawing, in millimetres; an inch drawing gets 100,000 / 25.4 in. */
  coordinateMm: 100_000,
  /** Vertices of all paths of one outline together. */
  outlineVertices: 50_000,
  /** Paths, and circles, of one outline. */
  outlinePaths: 10_000,
  outlineCircles: 10_000,
  /** Chords one arc or circle becomes when an outline is flattened for the overlap check. */
  arcChords: 1_024,
  /** Edge-against-edge tests of one overlap check; pairs past it are judged by their boxes. */
  overlapEdgeTests: 20_000_000,
  /** Overlapping pairs one check reports; a layout with more is refused on the first ones anyway. */
  overlapPairs: 1_000,
  /** Placements per template version. */
  placements: 5_000,
  /**
   * Stations per template version, all placements together (stops in use). The station engine's
   * scale test and benchmark lay out 16,000; a real plate holds a few hundred.
   */
  stations: 20_000,
  /** Components a template file or draft carries. */
  templateComponents: 1_000,
  /** Grid hole column and row numbers, either sign. */
  holeIndex: 10_000,
  /** Stops on one component (the catalog's own limit). */
  stops: 200,
  /** DXF: points all curves of one drawing flatten to, and one curve alone. */
  dxfPoints: 500_000,
  dxfCurvePoints: 20_000,
  /** DXF: vertices one LWPOLYLINE may declare (group 90). */
  dxfPolylineVertices: 50_000,
  /** DXF: control points and knots of one SPLINE, and its degree. */
  splineControlPoints: 5_000,
  splineDegree: 11,
  /** DXF inspect answer: at most this many times the file, or answerFloorBytes, whichever is larger. */
  answerMultiple: 20,
  answerFloorBytes: 4 * 1024 * 1024,
  /** XLSX: merged ranges on one sheet, and the cells they cover on all sheets together. */
  mergedRanges: 1_000,
  mergedCells: 100_000,
  /** XLSX: entries in the ZIP archive. */
  zipEntries: 2_000,
  /** Measured-bars file: rows below the header. */
  barRows: 10_000,
} as const;

/** C0 and C1 control characters (Unicode General Category Cc) other than tab, line feed and carriage return. */
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
/** Any control character, tab and line breaks included: for one-line names and codes. */
const CONTROL_ONE_LINE = /[\u0000-\u001f\u007f-\u009f]/;

export const hasControl = (s: string, multiline = false): boolean => (multiline ? CONTROL : CONTROL_ONE_LINE).test(s);

/** "1,024" */
export const count = (n: number): string => n.toLocaleString('en-US');
