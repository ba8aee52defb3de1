// Shared by the manifest tests: sample components, a hand-built minimal XLSX writer and an
// independent OOXML reader, both on jszip and ECMA-376 Part 1 alone (no exceljs), so the exported
// workbook is checked by a second reader and the reader is fed files exceljs did not write.
import JSZip from 'jszip';
import type { Component } from '../../shared/schemas/catalog';
import { columnLetter, columnNumber } from '../../shared/sheets/cell-address';
import { COMPONENT_COLUMNS } from '../../server/manifest/manifest-columns';

const stamp = { outline: null, outlineFile: null, seatHeight: 0, jawTop: null, usedBy: 0, createdAt: '2024-01-01T00:00:00.000Z', updatedAt: '2024-01-01T00:00:00.000Z' };

/** Three components that exercise every column: stops with z, angle and face; a clamp; a metric row. */
export function sampleComponents(): Component[] {
  return [
    {
      ...stamp, id: 1, code: 'CR-8', kind: 'center-rail', name: 'Center rail, 8 stops', unit: 'in', layer: 'FX-CR-8',
      dowels: [{ x: 0, y: 0 }, { x: 8, y: 0 }],
      stops: [{ x: 0.5, y: 0.375, angle: 0 }, { x: 1.5, y: -0.375, z: 0.25, angle: 180, face: 1 }],
      jawFaces: [{ x: 0, y: 0.375, normal: 90 }, { x: 0, y: -0.375, normal: 270 }],
      clamp: null, notes: 'Fixed jaw on both sides; "hardened" dowels',
    },
    {
      ...stamp, id: 2, code: 'JR-1.000', kind: 'jaw-rail', name: 'Jaw rail, 1.000 in', unit: 'in', layer: 'FX-JR-1000',
      dowels: [{ x: 0, y: 0 }, { x: 6, y: 0 }],
      stops: [],
      jawFaces: [{ x: 0, y: 1, normal: 270 }],
      clamp: { acceptBelow: 0.03, acceptAbove: 0.035, topHeight: 0.16, topSlope: 0.5, gripLow: 0.04, gripHigh: 0.16, gripSlope: 0.25, slotSlop: 0.015 },
      notes: '',
    },
    {
      ...stamp, id: 3, code: 'CR-M-200', kind: 'center-rail', name: 'Center rail 200 mm', unit: 'mm', layer: 'FX-CRM-200',
      // 0.375 in in mm: 9.525 exactly, but 25.4 * 0.375 is 9.524999999999999 in binary.
      dowels: [{ x: 0, y: 0 }, { x: 150, y: 25.4 * 0.375 }],
      stops: [{ x: 12.5, y: 9.525, angle: 0 }],
      jawFaces: [{ x: 0, y: 9.525, normal: 90 }],
      clamp: { acceptBelow: 0.8, acceptAbove: 0.8, topHeight: 4, topSlope: 0.5, gripLow: 1, gripHigh: 4, gripSlope: 0.5, slotSlop: 0.4 },
      notes: 'métrique',
    },
  ];
}

export const sampleLayers = () => [
  { name: 'FX-CR-8', holds: 'center rails with 8 stops', color: 1 },
  { name: 'FX-JR-1000', holds: 'jaw rails holding 1.000 in', color: 3 },
  { name: 'FX-CRM-200', holds: 'metric center rails', color: 255 },
];

export const HEADERS = COMPONENT_COLUMNS.map((c) => c.header);

// ---------- writing a workbook by hand ----------

export type HandCell = string | number | null | { formula: string; cached?: number | string } | { error: string };
/** A row as cells by column letter ("A", "AA", ...), or as a list from column A. */
export type HandRow = readonly HandCell[] | Readonly<Record<string, HandCell>>;
export interface HandSheet { name: string; rows: readonly HandRow[]; merges?: readonly string[] }

const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** One cell as SpreadsheetML writes it (ECMA-376 Part 1, §18.3.1.4 c, §18.3.1.53 is, §18.3.1.40 f). */
function cellXml(ref: string, v: HandCell): string {
  if (v === null) return '';
  if (typeof v === 'number') return `<c r="${ref}"><v>${v}</v></c>`;
  if (typeof v === 'string') return `<c r="${ref}" t="inlineStr"><is><t xml:space="preserve">${esc(v)}</t></is></c>`;
  if ('error' in v) return `<c r="${ref}" t="e"><v>${esc(v.error)}</v></c>`;
  if (v.cached === undefined) return `<c r="${ref}"><f>${esc(v.formula)}</f></c>`;
  return typeof v.cached === 'number'
    ? `<c r="${ref}"><f>${esc(v.formula)}</f><v>${v.cached}</v></c>`
    : `<c r="${ref}" t="str"><f>${esc(v.formula)}</f><v>${esc(v.cached)}</v></c>`;
}

export function sheetXml(sheet: HandSheet): string {
  const rows = sheet.rows
    .map((row, i) => {
      const r = i + 1;
      const entries: [string, HandCell][] = Array.isArray(row)
        ? (row as HandCell[]).map((v, j) => [columnLetter(j + 1), v])
        : Object.entries(row as Record<string, HandCell>).sort((a, b) => columnNumber(a[0]) - columnNumber(b[0]));
      const cells = entries.map(([col, v]) => cellXml(`${col}${r}`, v)).join('');
      return cells ? `<row r="${r}">${cells}</row>` : '';
    })
    .join('');
  const merges = sheet.merges?.length ? `<mergeCells count="${sheet.merges.length}">${sheet.merges.map((m) => `<mergeCell ref="${m}"/>`).join('')}</mergeCells>` : '';
  return `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${rows}</sheetData>${merges}</worksheet>`;
}

/**
 * The smallest package a spreadsheet program opens: content types, the package relationship to
 * the workbook, the workbook with its sheets, the workbook's relationships and one part per sheet
 * (ECMA-376 Part 2, §10.1 content types, §9.3 relationships; Part 1, §18.2.27 workbook).
 * No styles and no shared strings: text is written inline.
 */
export async function handXlsx(sheets: readonly HandSheet[], transform?: (zip: JSZip) => void): Promise<Buffer> {
  const zip = new JSZip();
  const main = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
  const rel = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
  zip.file(
    '[Content_Types].xml',
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">` +
      `<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>` +
      `<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>` +
      sheets.map((_, i) => `<Override PartName="/xl/worksheets/sheet${i + 1}.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>`).join('') +
      `</Types>`,
  );
  zip.file('_rels/.rels', `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${rel}/officeDocument" Target="xl/workbook.xml"/></Relationships>`);
  zip.file(
    'xl/workbook.xml',
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="${main}" xmlns:r="${rel}"><sheets>` +
      sheets.map((s, i) => `<sheet name="${esc(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`).join('') +
      `</sheets></workbook>`,
  );
  zip.file(
    'xl/_rels/workbook.xml.rels',
    `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
      sheets.map((_, i) => `<Relationship Id="rId${i + 1}" Type="${rel}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`).join('') +
      `</Relationships>`,
  );
  sheets.forEach((s, i) => zip.file(`xl/worksheets/sheet${i + 1}.xml`, sheetXml(s)));
  transform?.(zip);
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

/** A Components row from column A in the manifest's column order. */
export function componentRow(values: Partial<Record<(typeof COMPONENT_COLUMNS)[number]['key'], HandCell>>): HandCell[] {
  return COMPONENT_COLUMNS.map((c) => values[c.key] ?? null);
}

// ---------- reading a workbook without exceljs ----------

export interface RawCell {
  /** The t attribute; absent means a number (ECMA-376 Part 1, §18.18.11 ST_CellType, default "n"). */
  type: string;
  style: number;
  /** The text of <v>, or the inline string. */
  raw: string | null;
  /** The value: shared strings resolved, numbers as numbers. */
  value: string | number | null;
}

export interface RawSheet {
  name: string;
  xml: string;
  cells: Map<string, RawCell>;
}

export interface RawWorkbook {
  sheets: RawSheet[];
  /** cellXfs index → number format code (ECMA-376 Part 1, §18.8.10 cellXfs, §18.8.30 numFmt; id 0 is General). */
  formatOfStyle: (style: number) => string;
}

const unescape = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, '&');
const attr = (tag: string, name: string) => {
  const m = new RegExp(`\\s${name}="([^"]*)"`).exec(tag);
  return m ? unescape(m[1]!) : undefined;
};
/** All <t> runs of a string item, rich text included (ECMA-376 Part 1, §18.4.8 si, §18.4.12 t). */
const textOf = (xml: string) => [...xml.matchAll(/<t(?:\s[^>]*)?>([\s\S]*?)<\/t>/g)].map((m) => unescape(m[1]!)).join('');

/** Built-in number formats that the tests meet (ECMA-376 Part 1, §18.8.30, table of predefined ids). */
const BUILT_IN_FORMATS: Record<number, string> = { 0: 'General', 1: '0', 2: '0.00' };

export async function readRawWorkbook(buffer: Buffer): Promise<RawWorkbook> {
  const zip = await JSZip.loadAsync(buffer);
  const text = async (name: string) => (await zip.file(name)?.async('string')) ?? '';
  const workbook = await text('xl/workbook.xml');
  const rels = await text('xl/_rels/workbook.xml.rels');
  const targets = new Map([...rels.matchAll(/<Relationship\b[^>]*>/g)].map((m) => [attr(m[0], 'Id')!, attr(m[0], 'Target')!]));
  // Shared string table: <c t="s"><v>n</v></c> is item n of xl/sharedStrings.xml (§18.4.9 sst).
  const shared = [...(await text('xl/sharedStrings.xml')).matchAll(/<si>([\s\S]*?)<\/si>/g)].map((m) => textOf(m[1]!));
  const sheets: RawSheet[] = [];
  for (const m of workbook.matchAll(/<sheet\b[^>]*>/g)) {
    const name = attr(m[0], 'name')!;
    const target = targets.get(attr(m[0], 'r:id')!)!;
    const xml = await text(target.startsWith('/') ? target.slice(1) : `xl/${target}`);
    const cells = new Map<string, RawCell>();
    for (const c of xml.matchAll(/<c\b([^>]*?)(?:\/>|>([\s\S]*?)<\/c>)/g)) {
      const tag = `<c${c[1]}>`;
      const body = c[2] ?? '';
      const type = attr(tag, 't') ?? 'n';
      const v = /<v>([\s\S]*?)<\/v>/.exec(body)?.[1];
      const raw = type === 'inlineStr' ? textOf(body) : v === undefined ? null : unescape(v);
      const value = raw === null ? null : type === 's' ? shared[Number(raw)]! : type === 'n' ? Number(raw) : raw;
      cells.set(attr(tag, 'r')!, { type, style: Number(attr(tag, 's') ?? 0), raw, value });
    }
    sheets.push({ name, xml, cells });
  }
  const styles = await text('xl/styles.xml');
  const custom = new Map([...styles.matchAll(/<numFmt\b[^>]*>/g)].map((m) => [Number(attr(m[0], 'numFmtId')), attr(m[0], 'formatCode')!]));
  const xfs = [.../<cellXfs\b[^>]*>([\s\S]*?)<\/cellXfs>/.exec(styles)?.[1]?.matchAll(/<xf\b[^>]*>/g) ?? []].map((m) => Number(attr(m[0], 'numFmtId') ?? 0));
  return {
    sheets,
    formatOfStyle: (style) => {
      const id = xfs[style] ?? 0;
      return custom.get(id) ?? BUILT_IN_FORMATS[id] ?? `builtin ${id}`;
    },
  };
}
