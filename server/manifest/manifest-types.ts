import { LIMITS } from '../../shared/schemas/limits';
import type { ComponentFields } from '../../shared/schemas/catalog';
import type { ComponentColumnKey, LayerColumnKey, ManifestLayer } from './manifest-columns';

/**
 * What readManifest refuses before a workbook reaches exceljs, whose in-memory model costs a few
 * hundred bytes per cell: a manifest of a large shop is a few thousand rows, so these leave a
 * wide margin while keeping one upload well inside the server's memory.
 */
export interface ManifestLimits {
  /** The upload itself. */
  maxFileBytes: number;
  /** All zip entries together, uncompressed, as the central directory declares them and as they inflate. */
  maxUncompressedBytes: number;
  /**
   * Uncompressed ÷ compressed size of any entry larger than 1 MB uncompressed. Spreadsheet XML
   * deflates by 5–40× (measured on exceljs files); a deflate stream can reach about 1,000×,
   * which only a crafted file does.
   */
  maxCompressionRatio: number;
  /** Rows below the header on any one sheet. */
  maxDataRows: number;
  /** Cells on all sheets together. */
  maxCells: number;
  /** Entries in the ZIP archive. */
  maxEntries: number;
  /** Merged ranges on one sheet, and the cells all merged ranges cover together (exceljs fills each one). */
  maxMergedRanges: number;
  maxMergedCells: number;
  /** What the upload is, for messages: "a manifest", "a bars file". */
  label: string;
}

export const DEFAULT_MANIFEST_LIMITS: Readonly<ManifestLimits> = {
  maxFileBytes: 20 * 1024 * 1024,
  maxUncompressedBytes: 100 * 1024 * 1024,
  maxCompressionRatio: 200,
  maxDataRows: 20_000,
  maxCells: 1_000_000,
  maxEntries: LIMITS.zipEntries,
  maxMergedRanges: LIMITS.mergedRanges,
  maxMergedCells: LIMITS.mergedCells,
  label: 'a manifest',
};

export type ManifestErrorCode =
  | 'not-xlsx'
  | 'damaged'
  | 'too-large'
  | 'zip-bomb'
  | 'too-many-rows'
  | 'too-many-cells'
  | 'too-many-merged'
  | 'missing-sheet'
  | 'empty-sheet'
  | 'header'
  | 'merged'
  | 'formula'
  | 'cell-error'
  | 'not-a-number'
  | 'not-text'
  | 'invalid'
  | 'duplicate'
  | 'naming'
  | 'unknown-layer'
  | 'code-in-use';

/**
 * One problem, where it is: sheet (null for the file as a whole), row as numbered in the sheet
 * (1 is the header) and column letter; row and column are null when the problem is the sheet's.
 */
export interface ManifestError {
  sheet: string | null;
  row: number | null;
  column: string | null;
  code: ManifestErrorCode;
  /** A sentence saying what to fix. */
  message: string;
}

export interface ManifestComponentRow {
  row: number;
  /** The row as the catalog takes it; outline is always null (a manifest carries no outlines). */
  fields: ComponentFields;
}

export interface ManifestLayerRow {
  row: number;
  fields: ManifestLayer;
}

export interface ManifestRead {
  /** Rows that passed every check, in sheet order. */
  components: ManifestComponentRow[];
  layers: ManifestLayerRow[];
  errors: ManifestError[];
  /** Where each field was found, so later checks (planManifest) can name the cell. */
  columns: {
    components: Partial<Record<ComponentColumnKey, string>>;
    layers: Partial<Record<LayerColumnKey, string>>;
  };
  /** The sheets' names as the file spells them; layers is null for a CSV or a workbook without a Layers sheet. */
  sheets: { components: string | null; layers: string | null };
}
