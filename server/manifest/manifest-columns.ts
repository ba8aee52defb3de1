/**
 * The manifest's sheets and columns, shared by the writer and the reader so the two cannot drift.
 * Headers are the catalog's field names; the reader finds columns by header, so a shop may
 * reorder them or keep columns of its own beside them.
 */
import { z } from 'zod';
import type { ClampModel } from '../../shared/schemas/catalog';

export const COMPONENTS_SHEET = 'Components';
export const LAYERS_SHEET = 'Layers';
export const STATIONS_SHEET = 'Stations';

export const CLAMP_FIELDS = ['acceptBelow', 'acceptAbove', 'topHeight', 'topSlope', 'gripLow', 'gripHigh', 'gripSlope', 'slotSlop'] as const satisfies readonly (keyof ClampModel)[];
export type ClampField = (typeof CLAMP_FIELDS)[number];

export type ComponentColumnKey = 'code' | 'kind' | 'name' | 'unit' | 'layer' | 'dowels' | 'stops' | 'jawFaces' | ClampField | 'notes';
export type LayerColumnKey = 'name' | 'holds' | 'color';

/** How a column's cells are read: text, one of fixed values, a point list, or a number. */
export type ColumnType = 'text' | 'choice' | 'dowels' | 'stops' | 'jawFaces' | 'length' | 'slope' | 'whole';

export interface ColumnSpec<K extends string> {
  key: K;
  header: string;
  type: ColumnType;
  width: number;
  /** Shown as the header cell's note in the written workbook. */
  note?: string;
}

const clampColumn = (key: ClampField): ColumnSpec<ComponentColumnKey> => ({
  key,
  header: key,
  type: key === 'topSlope' || key === 'gripSlope' ? 'slope' : 'length',
  width: 12,
});

export const COMPONENT_COLUMNS: readonly ColumnSpec<ComponentColumnKey>[] = [
  { key: 'code', header: 'code', type: 'text', width: 16, note: 'Component code, unique in the catalog (letters, digits, ".", "-", "_"), held to the naming convention.' },
  { key: 'kind', header: 'kind', type: 'choice', width: 13 },
  { key: 'name', header: 'name', type: 'text', width: 28 },
  { key: 'unit', header: 'unit', type: 'choice', width: 6, note: 'in or mm: the unit of every length on the row.' },
  { key: 'layer', header: 'layer', type: 'text', width: 16, note: 'DXF layer of the component; when the workbook has a Layers sheet it must be listed there.' },
  {
    key: 'dowels', header: 'dowels', type: 'dowels', width: 22,
    note: 'Locating dowels as x,y pairs separated by ";", e.g. 0,0; 8,0. The first is the primary dowel and sits at 0,0. Decimal point ".".',
  },
  {
    key: 'stops', header: 'stops', type: 'stops', width: 34,
    note: 'Stop positions x,y[,z][@angle][#face] separated by ";", e.g. 0.5,0.375@0; 1.5,0.375@0. Angle in degrees; #face counts jaw faces from 1.',
  },
  {
    key: 'jawFaces', header: 'jaw faces', type: 'jawFaces', width: 22,
    note: 'Jaw faces x,y@normal separated by ";", e.g. 0,0.375@90: a point on the face and the direction of its outward normal in degrees from +X.',
  },
  {
    ...clampColumn('acceptBelow'),
    note: 'Clamp model: fill all eight columns acceptBelow to slotSlop, or leave all eight empty for a component without a clamp. Lengths in the row\'s unit; topSlope and gripSlope are rise per unit of width.',
  },
  ...CLAMP_FIELDS.slice(1).map(clampColumn),
  { key: 'notes', header: 'notes', type: 'text', width: 30 },
];

export const LAYER_COLUMNS: readonly ColumnSpec<LayerColumnKey>[] = [
  { key: 'name', header: 'layer', type: 'text', width: 18, note: 'DXF layer name, held to the naming convention.' },
  { key: 'holds', header: 'holds', type: 'text', width: 36, note: 'What the layer holds, in words.' },
  { key: 'color', header: 'color', type: 'whole', width: 8, note: 'DXF color number 1-255 (group code 62 of the LAYER table entry).' },
];

/** Headers match regardless of case, spaces, "_" and "-": "Jaw Faces", "jaw_faces" and "jawFaces" are one header. */
export const normalizeHeader = (text: string) => text.toLowerCase().replace(/[\s_-]+/g, '');

/** One row of the Layers sheet. */
export const ManifestLayerSchema = z.object({
  name: z.string({ message: 'Layer name is required.' }).trim().min(1, 'Layer name is required.').max(255, 'A layer name must be 255 characters or fewer.'),
  holds: z.string().trim().max(200, 'What the layer holds must be 200 characters or fewer.').default(''),
  // DXF Reference, LAYER table, group code 62: color number, 1-255 (negative means the layer is off).
  color: z
    .number({ message: 'Color must be a DXF color number from 1 to 255.' })
    .int('Color must be a whole number from 1 to 255.')
    .min(1, 'Color must be a DXF color number from 1 to 255.')
    .max(255, 'Color must be a DXF color number from 1 to 255.'),
});
export type ManifestLayer = z.output<typeof ManifestLayerSchema>;
