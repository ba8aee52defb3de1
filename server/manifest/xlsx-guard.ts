/**
 * Checks an upload is a workbook of a size Gridset will load, before exceljs inflates it whole.
 *
 * An XLSX file is an OPC package, i.e. a ZIP archive (ECMA-376 Part 2, §8 and Annex C; the ZIP
 * format per PKWARE's APPNOTE.TXT 6.3.x). The central directory at the end of the archive lists
 * every entry with its compressed and uncompressed size (APPNOTE §4.3.12), so a file whose entries
 * declare too much is refused without inflating anything. The directory is read by yauzl 3
 * (README: "validateEntrySizes … allows clients to trust the uncompressedSize field"; every offset
 * is bounds-checked), so a lying or truncated archive is a refusal, never an out-of-range read.
 * Worksheets are counted on the way (rows, cells, merged ranges), so a sheet of a million rows or
 * a merge of A1:XFD1048576 is refused before exceljs builds a model of it.
 */
import JSZip from 'jszip';
import yauzl from 'yauzl';
import { columnNumber } from '../../shared/sheets/cell-address';
import type { ManifestLimits } from './manifest-types';

export interface GuardProblem {
  code: 'not-xlsx' | 'damaged' | 'too-large' | 'zip-bomb' | 'too-many-rows' | 'too-many-cells' | 'too-many-merged';
  message: string;
  sheet?: string;
}

export interface SheetCount {
  /** The sheet's name in the workbook, or its part name when the workbook does not name it. */
  name: string;
  part: string;
  /** <row> elements that hold at least one cell, header included. */
  rows: number;
  cells: number;
}

export type GuardResult = { ok: true; sheets: SheetCount[]; workbook: Buffer } | { ok: false; problem: GuardProblem };

const MB = 1024 * 1024;
const mb = (n: number) => `${Math.round((n / MB) * 10) / 10} MB`;
const SIG_LOCAL = 0x04034b50;

const fail = (code: GuardProblem['code'], message: string, sheet?: string): GuardResult => ({ ok: false, problem: { code, message, ...(sheet ? { sheet } : {}) } });

/** What a file that is not a zip archive most likely is, for a message that says how to fix it. */
function notZipMessage(buf: Buffer): string {
  // OLE2 compound file signature (MS-CFB §2.2): Excel 97–2003 .xls, or a password-protected .xlsx.
  if (buf.length >= 8 && buf.readUInt32BE(0) === 0xd0cf11e0 && buf.readUInt32BE(4) === 0xa1b11ae1) {
    return 'This file is an Excel 97–2003 workbook (.xls) or a password-protected workbook, not an XLSX file; remove any password and save it as "Excel Workbook (.xlsx)".';
  }
  const head = buf.subarray(0, 512).toString('utf8');
  if (buf.length > 0 && /^[\x09\x0a\x0d\x20-\x7e\u00a0-\uffff]*$/.test(head) && head.includes(',')) {
    return 'This file is text (it looks like CSV), not an XLSX workbook; upload it as a CSV file, or open it in a spreadsheet program and save it as .xlsx.';
  }
  return 'This file is not an XLSX workbook (an XLSX file is a ZIP archive starting with "PK"); open it in a spreadsheet program and save it as "Excel Workbook (.xlsx)".';
}

/** An entry's bytes, inflated by yauzl, which stops with an error past the size the directory declares. */
async function entryBytes(zip: yauzl.ZipFile, entry: yauzl.Entry): Promise<Buffer> {
  const stream = await zip.openReadStreamPromise(entry);
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

const decodeXml = (s: string) =>
  s.replace(/&(lt|gt|amp|quot|apos|#\d+|#x[0-9a-f]+);/gi, (m, e: string) => {
    const k = e.toLowerCase();
    if (k === 'lt') return '<';
    if (k === 'gt') return '>';
    if (k === 'amp') return '&';
    if (k === 'quot') return '"';
    if (k === 'apos') return "'";
    const cp = k.startsWith('#x') ? parseInt(k.slice(2), 16) : parseInt(k.slice(1), 10);
    return Number.isFinite(cp) && cp <= 0x10ffff ? String.fromCodePoint(cp) : m;
  });

const attr = (tag: string, name: string) => {
  const m = new RegExp(`\\s${name}\\s*=\\s*(?:"([^"]*)"|'([^']*)')`).exec(tag);
  return m ? decodeXml(m[1] ?? m[2] ?? '') : undefined;
};

/**
 * Sheet names by part name: workbook.xml lists <sheet name r:id> (ECMA-376 Part 1, §18.2.19) and
 * its relationships part maps each id to the worksheet part (Part 2, §9.3). Elements may carry a
 * namespace prefix, so tags are matched with any prefix.
 */
function sheetNames(workbookXml: string, relsXml: string | undefined): Map<string, string> {
  const targets = new Map<string, string>();
  for (const m of (relsXml ?? '').matchAll(/<(?:[\w.-]+:)?Relationship\b[^>]*>/g)) {
    const id = attr(m[0], 'Id');
    const target = attr(m[0], 'Target');
    if (!id || !target) continue;
    const part = target.startsWith('/') ? target.slice(1) : `xl/${target}`;
    targets.set(id, part.replace(/\/\.\//g, '/'));
  }
  const names = new Map<string, string>();
  for (const m of workbookXml.matchAll(/<(?:[\w.-]+:)?sheet\b[^>]*>/g)) {
    const name = attr(m[0], 'name');
    const id = /\s[\w.-]+:id\s*=\s*(?:"([^"]*)"|'([^']*)')/.exec(m[0]);
    const part = id ? targets.get(id[1] ?? id[2] ?? '') : undefined;
    if (name && part) names.set(part, name);
  }
  return names;
}

/**
 * Counts <row> elements holding cells, and <c> elements (ECMA-376 Part 1, §18.3.1.73 and §18.3.1.4)
 * on the raw text: latin1 decoding keeps every ASCII tag as is and costs one byte per character.
 * Counting stops once a limit is passed, so a sheet of a million rows costs no more than one at the limit.
 */
function countSheet(xml: Buffer, maxRows: number, maxCells: number): { rows: number; cells: number; over: boolean } {
  const text = xml.toString('latin1');
  let rows = 0;
  for (const m of text.matchAll(/<(?:[\w.-]+:)?row\b[^>]*?(\/?)>/g)) {
    if (m[1] !== '/' && ++rows > maxRows) return { rows, cells: 0, over: true };
  }
  let cells = 0;
  for (const cellTag = /<(?:[\w.-]+:)?c\b/g; cellTag.exec(text) !== null; ) {
    if (++cells > maxCells) return { rows, cells, over: true };
  }
  return { rows, cells, over: false };
}

/**
 * Parts exceljs 4.4 cannot read as other programs write them: legacy cell comments and the VML
 * drawing that shows them (ECMA-376 Part 1, §18.7 Comments and §18.3.1.48 legacyDrawing; VML per
 * Part 4), threaded comments with their persons, and drawings with their charts (§18.3.1.36
 * drawing; DrawingML, Part 1 §20). exceljs throws on the comment parts openpyxl writes
 * (exceljs issue #2797, "Cannot read properties of undefined (reading 'comments')") and on some
 * drawings (#2591, "… (reading 'anchors')"), both open; none of them holds a cell value, so they
 * are left out, with their relationships, elements and content types.
 */
const DROPPED_PART = /^xl\/(?:comments[^/]*\.xml|comments\/.*|threadedComments\/.*|persons\/.*|drawings\/.*|charts\/.*)$/i;
const DROPPED_REL = /\/(?:comments|vmlDrawing|threadedComment|person|drawing|chart)$/;

/** Merged ranges of a worksheet (<mergeCell ref>, ECMA-376 Part 1, §18.3.1.55): count and cells covered. */
function mergedArea(text: string, maxRanges: number): { ranges: number; cells: number } {
  let ranges = 0;
  let cells = 0;
  for (const m of text.matchAll(/<(?:[\w.-]+:)?mergeCell\b[^>]*>/g)) {
    if (++ranges > maxRanges) break;
    const ref = attr(m[0], 'ref') ?? '';
    const r = /^\$?([A-Z]{1,3})\$?(\d{1,7})(?::\$?([A-Z]{1,3})\$?(\d{1,7}))?$/i.exec(ref.trim());
    if (!r) continue;
    const c1 = columnNumber(r[1]!.toUpperCase());
    const c2 = r[3] ? columnNumber(r[3].toUpperCase()) : c1;
    const r1 = Number(r[2]);
    const r2 = r[4] ? Number(r[4]) : r1;
    cells += (Math.abs(c2 - c1) + 1) * (Math.abs(r2 - r1) + 1);
  }
  return { ranges, cells };
}

/** The part without the relationships, elements and content types of the dropped parts. */
function withoutDropped(name: string, data: Buffer, dropped: ReadonlySet<string>): Buffer {
  if (name.endsWith('.rels')) {
    const text = data.toString('utf8');
    const kept = text.replace(/<(?:[\w.-]+:)?Relationship\b[^>]*?(?:\/>|>\s*<\/(?:[\w.-]+:)?Relationship>)/g, (tag) => (DROPPED_REL.test(attr(tag, 'Type') ?? '') ? '' : tag));
    return kept === text ? data : Buffer.from(kept, 'utf8');
  }
  if (/^xl\/worksheets\/[^/]+\.xml$/.test(name)) {
    const text = data.toString('utf8');
    const kept = text.replace(/<(?:[\w.-]+:)?(?:legacyDrawing(?:HF)?|drawing)\b[^>]*?\/>/g, '');
    return kept === text ? data : Buffer.from(kept, 'utf8');
  }
  if (name === '[Content_Types].xml') {
    const text = data.toString('utf8');
    const kept = text
      .replace(/<(?:[\w.-]+:)?Override\b[^>]*?\/>/g, (tag) => (dropped.has((attr(tag, 'PartName') ?? '').replace(/^\//, '')) ? '' : tag))
      .replace(/<(?:[\w.-]+:)?Default\b[^>]*?Extension\s*=\s*["']vml["'][^>]*?\/>/gi, '');
    return kept === text ? data : Buffer.from(kept, 'utf8');
  }
  return data;
}

/**
 * Reads the archive's central directory with yauzl (which bounds-checks every offset and length,
 * and refuses an entry that inflates to more or less than it declares), refuses what is too large
 * or too many before inflating, then counts rows, cells and merged cells of every sheet. On
 * success `workbook` is the file exceljs may load: the upload itself, or a copy without the
 * comment parts exceljs cannot read.
 */
export async function guardXlsx(buf: Buffer, limits: ManifestLimits): Promise<GuardResult> {
  const what = limits.label;
  if (buf.length > limits.maxFileBytes) {
    return fail('too-large', `The file is ${mb(buf.length)}; ${what} may be at most ${mb(limits.maxFileBytes)}. Split it into several files.`);
  }
  // Local file header signature "PK\x03\x04" (APPNOTE §4.3.7); an XLSX file always starts with one.
  if (buf.length < 4 || buf.readUInt32LE(0) !== SIG_LOCAL) return fail('not-xlsx', notZipMessage(buf));
  let zip: yauzl.ZipFile;
  try {
    zip = await yauzl.fromBufferPromise(buf, { strictFileNames: true, validateEntrySizes: true });
  } catch (err) {
    return fail('damaged', `The file is damaged: its ZIP directory cannot be read (${(err as Error).message.replace(/\.$/, '')}). Open it in a spreadsheet program and save it again as .xlsx.`);
  }
  try {
    if (zip.entryCount > limits.maxEntries) {
      return fail('zip-bomb', `The workbook holds ${zip.entryCount.toLocaleString('en-US')} parts; ${what} may hold at most ${limits.maxEntries.toLocaleString('en-US')}. Save it again from a spreadsheet program, without unused sheets and pictures.`);
    }
    const entries: yauzl.Entry[] = [];
    let declared = 0;
    try {
      for await (const e of zip.eachEntry()) {
        if (e.fileName.split('/').includes('..')) return fail('damaged', `The entry ${e.fileName} names a folder outside the archive; the file is refused as crafted or damaged.`);
        if (e.isEncrypted()) return fail('not-xlsx', `The entry ${e.fileName} is encrypted; remove the password and save the workbook again.`);
        if (e.compressionMethod !== 0 && e.compressionMethod !== 8) {
          return fail('damaged', `The entry ${e.fileName} uses ZIP compression method ${e.compressionMethod}; XLSX files use deflate (8) or none (0). Save the workbook again from a spreadsheet program.`);
        }
        declared += e.uncompressedSize;
        const ratio = e.uncompressedSize / Math.max(1, e.compressedSize);
        if (e.uncompressedSize > MB && ratio > limits.maxCompressionRatio) {
          return fail('zip-bomb', `The entry ${e.fileName} claims to unpack ${Math.round(ratio)} times its packed size (${mb(e.uncompressedSize)}), past the ${limits.maxCompressionRatio}× a spreadsheet reaches; the file is refused as a possible zip bomb.`);
        }
        entries.push(e);
      }
    } catch (err) {
      return fail('damaged', `The file is damaged: ${(err as Error).message.replace(/\.$/, '')}. Open it in a spreadsheet program and save it again as .xlsx.`);
    }
    if (declared > limits.maxUncompressedBytes) {
      return fail('zip-bomb', `The workbook unpacks to ${mb(declared)}, more than the ${mb(limits.maxUncompressedBytes)} ${what} may take; remove unused sheets, pictures and formatting, or split it.`);
    }
    const byName = new Map(entries.map((e) => [e.fileName, e]));
    const data = new Map<string, Buffer>();
    const read = async (e: yauzl.Entry): Promise<Buffer | string> => {
      try {
        const d = await entryBytes(zip, e);
        data.set(e.fileName, d);
        return d;
      } catch (err) {
        const why = (err as Error).message;
        if (/too many bytes/.test(why)) return `the entry ${e.fileName} inflates past the ${e.uncompressedSize} bytes it declares`;
        if (/too few bytes/.test(why)) return `the entry ${e.fileName} inflates to less than the ${e.uncompressedSize} bytes it declares`;
        return `the entry ${e.fileName} does not inflate (${why.replace(/\.$/, '')})`;
      }
    };
    if (!byName.has('xl/workbook.xml')) {
      const mimetype = byName.get('mimetype');
      const ods = mimetype && mimetype.uncompressedSize < 1024 ? await read(mimetype) : null;
      if (Buffer.isBuffer(ods) && ods.toString('latin1').includes('opendocument.spreadsheet')) {
        return fail('not-xlsx', 'This file is an OpenDocument spreadsheet (.ods), not an XLSX workbook; save it as "Excel 2007-365 (.xlsx)" and upload that.');
      }
      return fail('not-xlsx', 'This file is a ZIP archive without xl/workbook.xml, so it is not an XLSX workbook; open it in a spreadsheet program and save it as .xlsx.');
    }
    const dropped = new Set(entries.map((e) => e.fileName).filter((n) => DROPPED_PART.test(n)));
    for (const e of entries) {
      if (dropped.has(e.fileName) || e.fileName.endsWith('/')) continue;
      const d = await read(e);
      if (typeof d === 'string') return fail('zip-bomb', `The file is refused: ${d}, as a crafted or damaged file does.`);
    }
    const text = (name: string) => data.get(name)?.toString('utf8');
    const names = sheetNames(text('xl/workbook.xml') ?? '', text('xl/_rels/workbook.xml.rels'));
    const sheets: SheetCount[] = [];
    let cells = 0;
    let merged = 0;
    for (const [part, xml] of data) {
      if (!/^xl\/worksheets\/[^/]+\.xml$/.test(part)) continue;
      const name = names.get(part) ?? part;
      const count = countSheet(xml, limits.maxDataRows + 1, limits.maxCells - cells);
      if (count.rows - 1 > limits.maxDataRows) {
        return fail('too-many-rows', `The sheet "${name}" has more than ${limits.maxDataRows.toLocaleString('en-US')} rows below the header, the most ${what} takes. Split it into several files, or delete the empty rows that carry formatting.`, name);
      }
      cells += count.cells;
      if (count.over) {
        return fail('too-many-cells', `The workbook has more than ${limits.maxCells.toLocaleString('en-US')} cells, the most ${what} takes. Remove sheets and columns the import does not need.`);
      }
      // Merged ranges are counted here because exceljs fills in every cell a range covers.
      const m = mergedArea(xml.toString('latin1'), limits.maxMergedRanges);
      merged += m.cells;
      if (m.ranges > limits.maxMergedRanges) {
        return fail('too-many-merged', `The sheet "${name}" has more than ${limits.maxMergedRanges.toLocaleString('en-US')} merged ranges, the most ${what} takes; unmerge the cells and save again.`, name);
      }
      if (merged > limits.maxMergedCells) {
        return fail('too-many-merged', `Merged ranges cover more than ${limits.maxMergedCells.toLocaleString('en-US')} cells (the sheet "${name}" passed the limit); unmerge large ranges (Format → Merge) and save again.`, name);
      }
      sheets.push({ name, part, rows: count.rows, cells: count.cells });
    }
    if (dropped.size === 0) return { ok: true, sheets, workbook: buf };
    const out = new JSZip();
    for (const [name, d] of data) out.file(name, withoutDropped(name, d, dropped));
    return { ok: true, sheets, workbook: await out.generateAsync({ type: 'nodebuffer', compression: 'STORE' }) };
  } finally {
    zip.close();
  }
}
