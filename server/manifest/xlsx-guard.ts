/**
 * Checks an upload is a workbook of a size Gridset will load, before exceljs inflates it whole.
 *
 * An XLSX file is an OPC package, i.e. a ZIP archive (ECMA-376 Part 2, §8 and Annex C; the ZIP
 * format per PKWARE's APPNOTE.TXT 6.3.x). The central directory at the end of the archive lists
 * every entry with its compressed and uncompressed size (APPNOTE §4.3.12), so a file whose entries
 * declare too much is refused without inflating anything. Declared sizes can lie, so each entry
 * is then inflated with its declared size as a hard output cap (node:zlib maxOutputLength): an
 * entry that inflates past what it declares is refused as crafted or damaged. Worksheets are
 * counted on the way (rows and cells), so a sheet of a million rows is refused before exceljs
 * builds a model of it.
 */
import { inflateRawSync } from 'node:zlib';
import type { ManifestLimits } from './manifest-types';

export interface GuardProblem {
  code: 'not-xlsx' | 'damaged' | 'too-large' | 'zip-bomb' | 'too-many-rows' | 'too-many-cells';
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

export type GuardResult = { ok: true; sheets: SheetCount[] } | { ok: false; problem: GuardProblem };

interface Entry {
  name: string;
  method: number;
  flags: number;
  compressedSize: number;
  uncompressedSize: number;
  localHeaderOffset: number;
}

const SIG_LOCAL = 0x04034b50;
const SIG_CENTRAL = 0x02014b50;
const SIG_EOCD = 0x06054b50;
const SIG_ZIP64_EOCD = 0x06064b50;
const SIG_ZIP64_LOCATOR = 0x07064b50;
const MB = 1024 * 1024;
const mb = (n: number) => `${Math.round((n / MB) * 10) / 10} MB`;

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

function findEocd(buf: Buffer): number {
  // The end-of-central-directory record is 22 bytes plus a comment of at most 65,535 (APPNOTE §4.3.16).
  const stop = Math.max(0, buf.length - 22 - 0xffff);
  for (let i = buf.length - 22; i >= stop; i--) if (buf.readUInt32LE(i) === SIG_EOCD) return i;
  return -1;
}

function readEntries(buf: Buffer): Entry[] | string {
  const eocd = findEocd(buf);
  if (eocd < 0) return 'the ZIP archive has no central directory (the file is cut short or damaged)';
  let count = buf.readUInt16LE(eocd + 10);
  let cdSize = buf.readUInt32LE(eocd + 12);
  let cdOffset = buf.readUInt32LE(eocd + 16);
  if (count === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
    // ZIP64 end of central directory, found through its locator just before the EOCD (APPNOTE §4.3.14–15).
    const loc = eocd - 20;
    if (loc < 0 || buf.readUInt32LE(loc) !== SIG_ZIP64_LOCATOR) return 'the ZIP64 end record is missing';
    const at = Number(buf.readBigUInt64LE(loc + 8));
    if (at + 56 > buf.length || buf.readUInt32LE(at) !== SIG_ZIP64_EOCD) return 'the ZIP64 end record is damaged';
    count = Number(buf.readBigUInt64LE(at + 32));
    cdSize = Number(buf.readBigUInt64LE(at + 40));
    cdOffset = Number(buf.readBigUInt64LE(at + 48));
  }
  if (cdOffset + cdSize > buf.length) return 'the central directory points past the end of the file';
  const entries: Entry[] = [];
  let p = cdOffset;
  for (let i = 0; i < count; i++) {
    if (p + 46 > buf.length || buf.readUInt32LE(p) !== SIG_CENTRAL) return 'a central directory entry is damaged';
    const nameLen = buf.readUInt16LE(p + 28);
    const extraLen = buf.readUInt16LE(p + 30);
    const commentLen = buf.readUInt16LE(p + 32);
    const e: Entry = {
      name: buf.toString('utf8', p + 46, p + 46 + nameLen),
      flags: buf.readUInt16LE(p + 8),
      method: buf.readUInt16LE(p + 10),
      compressedSize: buf.readUInt32LE(p + 20),
      uncompressedSize: buf.readUInt32LE(p + 24),
      localHeaderOffset: buf.readUInt32LE(p + 42),
    };
    // Fields at 0xFFFFFFFF continue in the ZIP64 extra field, in this order (APPNOTE §4.5.3).
    let x = p + 46 + nameLen;
    const end = x + extraLen;
    while (x + 4 <= end) {
      const id = buf.readUInt16LE(x);
      const size = buf.readUInt16LE(x + 2);
      if (id === 0x0001) {
        let q = x + 4;
        const next = () => { const v = q + 8 <= x + 4 + size ? Number(buf.readBigUInt64LE(q)) : NaN; q += 8; return v; };
        if (e.uncompressedSize === 0xffffffff) e.uncompressedSize = next();
        if (e.compressedSize === 0xffffffff) e.compressedSize = next();
        if (e.localHeaderOffset === 0xffffffff) e.localHeaderOffset = next();
      }
      x += 4 + size;
    }
    if (![e.uncompressedSize, e.compressedSize, e.localHeaderOffset].every(Number.isFinite)) return `the ZIP64 sizes of ${e.name} are damaged`;
    entries.push(e);
    p += 46 + nameLen + extraLen + commentLen;
  }
  return entries;
}

function entryData(buf: Buffer, e: Entry): Buffer | string {
  const h = e.localHeaderOffset;
  if (h + 30 > buf.length || buf.readUInt32LE(h) !== SIG_LOCAL) return `the entry ${e.name} is damaged`;
  const start = h + 30 + buf.readUInt16LE(h + 26) + buf.readUInt16LE(h + 28);
  if (start + e.compressedSize > buf.length) return `the entry ${e.name} runs past the end of the file`;
  const raw = buf.subarray(start, start + e.compressedSize);
  if (e.method === 0) return raw; // stored
  try {
    // +1 so an entry that inflates past its declared size is caught rather than cut to fit.
    const out = inflateRawSync(raw, { maxOutputLength: e.uncompressedSize + 1 });
    if (out.length !== e.uncompressedSize) return `the entry ${e.name} inflates to ${out.length} bytes but declares ${e.uncompressedSize}`;
    return out;
  } catch (err) {
    const code = (err as { code?: string }).code;
    if (code === 'ERR_BUFFER_TOO_LARGE') return `the entry ${e.name} inflates past the ${e.uncompressedSize} bytes it declares`;
    return `the entry ${e.name} does not inflate (${(err as Error).message})`;
  }
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

export function guardXlsx(buf: Buffer, limits: ManifestLimits): GuardResult {
  if (buf.length > limits.maxFileBytes) {
    return fail('too-large', `The file is ${mb(buf.length)}; a manifest may be at most ${mb(limits.maxFileBytes)}. Split the catalog into several files.`);
  }
  // Local file header signature "PK\x03\x04" (APPNOTE §4.3.7); an XLSX file always starts with one.
  if (buf.length < 4 || buf.readUInt32LE(0) !== SIG_LOCAL) return fail('not-xlsx', notZipMessage(buf));
  const entries = readEntries(buf);
  if (typeof entries === 'string') return fail('damaged', `The file is damaged: ${entries}. Open it in a spreadsheet program and save it again as .xlsx.`);
  const byName = new Map(entries.map((e) => [e.name, e]));
  if (!byName.has('xl/workbook.xml')) {
    const mimetype = byName.get('mimetype');
    const ods = mimetype ? entryData(buf, mimetype) : null;
    if (Buffer.isBuffer(ods) && ods.toString('latin1').includes('opendocument.spreadsheet')) {
      return fail('not-xlsx', 'This file is an OpenDocument spreadsheet (.ods), not an XLSX workbook; save it as "Excel 2007-365 (.xlsx)" and upload that.');
    }
    return fail('not-xlsx', 'This file is a ZIP archive without xl/workbook.xml, so it is not an XLSX workbook; open the manifest in a spreadsheet program and save it as .xlsx.');
  }

  const declared = entries.reduce((sum, e) => sum + e.uncompressedSize, 0);
  if (declared > limits.maxUncompressedBytes) {
    return fail('zip-bomb', `The workbook unpacks to ${mb(declared)}, more than the ${mb(limits.maxUncompressedBytes)} a manifest may take; remove unused sheets, pictures and formatting, or split the catalog.`);
  }
  for (const e of entries) {
    if (e.flags & 1) return fail('not-xlsx', `The entry ${e.name} is encrypted; remove the password and save the workbook again.`);
    if (e.method !== 0 && e.method !== 8) {
      return fail('damaged', `The entry ${e.name} uses ZIP compression method ${e.method}; XLSX files use deflate (8) or none (0). Save the workbook again from a spreadsheet program.`);
    }
    const ratio = e.uncompressedSize / Math.max(1, e.compressedSize);
    if (e.uncompressedSize > MB && ratio > limits.maxCompressionRatio) {
      return fail('zip-bomb', `The entry ${e.name} claims to unpack ${Math.round(ratio)} times its packed size (${mb(e.uncompressedSize)}), past the ${limits.maxCompressionRatio}× a spreadsheet reaches; the file is refused as a possible zip bomb.`);
    }
  }

  const text = (name: string): string | undefined => {
    const e = byName.get(name);
    const d = e ? entryData(buf, e) : undefined;
    return Buffer.isBuffer(d) ? d.toString('utf8') : undefined;
  };
  const names = sheetNames(text('xl/workbook.xml') ?? '', text('xl/_rels/workbook.xml.rels'));
  const sheets: SheetCount[] = [];
  let cells = 0;
  for (const e of entries) {
    const data = entryData(buf, e);
    if (typeof data === 'string') return fail('zip-bomb', `The file is refused: ${data}, as a crafted or damaged file does.`);
    if (!/^xl\/worksheets\/[^/]+\.xml$/.test(e.name)) continue;
    const name = names.get(e.name) ?? e.name;
    const count = countSheet(data, limits.maxDataRows + 1, limits.maxCells - cells);
    if (count.rows - 1 > limits.maxDataRows) {
      return fail('too-many-rows', `The sheet "${name}" has more than ${limits.maxDataRows.toLocaleString('en-US')} rows below the header, the most a manifest takes. Split it into several files, or delete the empty rows that carry formatting.`, name);
    }
    cells += count.cells;
    if (count.over) {
      return fail('too-many-cells', `The workbook has more than ${limits.maxCells.toLocaleString('en-US')} cells, the most a manifest takes. Remove sheets and columns the import does not need.`);
    }
    sheets.push({ name, part: e.name, rows: count.rows, cells: count.cells });
  }
  return { ok: true, sheets };
}
