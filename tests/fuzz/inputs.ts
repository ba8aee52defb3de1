/**
 * Hostile and mutated inputs for every upload route and JSON write route, from a seeded PRNG so a
 * failing case can be replayed by its seed and index. Seeds are files other programs wrote
 * (tests/fixtures: ezdxf, openpyxl, LibreOffice) and what Gridset itself answers (the demo
 * shop's records, its own manifest.xlsx); mutations follow common fuzzing practice (byte flips,
 * truncation, splices, boundary numbers), plus the inputs that once crashed the server.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import JSZip from 'jszip';
import { dxfDocument, entity, circle, lwpolyline } from '../server/dxf-test-helpers';

/** mulberry32 (Tommy Ettinger's public-domain 32-bit generator): small, fast, seedable. */
export function makeRng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const int = (n: number) => Math.floor(next() * n);
  return { next, int, pick: <T>(xs: readonly T[]): T => xs[int(xs.length)]! };
}
export type Rng = ReturnType<typeof makeRng>;

const FIXTURES = path.resolve(import.meta.dirname, '../fixtures');
const fixture = (p: string) => readFileSync(path.join(FIXTURES, p));

/** Numbers at and past every boundary: IEEE 754 extremes, 2^31/2^53 edges, the limits' neighbours. */
export const HOSTILE_NUMBERS = [0, -0, -1, 1e-320, 1e-9, 0.5, 99_999.999, 100_001, 1e6, 1e9, 999_999_999, 2 ** 31, 2 ** 53 + 1, 1e12, 1e300, -1e308, 1.7976931348623157e308, Number.MAX_SAFE_INTEGER];
const HOSTILE_TEXT = ['', ' ', 'A\u0000B', 'tab\there', 'line\nbreak', '\u001b[31mred', '\u0085', '<script>x</script>', ']]>', '&amp;', '\ud800', 'x'.repeat(10_000), '𝔾ridset', '../../etc/passwd', 'NaN', '1e999', '-0'];
const HOSTILE_NUMBER_TEXT = ['1e12', '-1e308', '1e309', 'NaN', 'inf', '999999999', '-0', '0x10', '', ' ', '1,5', '1e-400', '9'.repeat(400)];

// ---------- files ----------

export function dxfSeeds(): Buffer[] {
  return [
    'dxf/jaw-rail-inch-r2000.dxf', 'dxf/subplate-mm-blocks-r2018.dxf', 'dxf/part-outline-r12.dxf', 'dxf/spline-text-point-r2000.dxf',
  ].map(fixture);
}

/** The inputs that once crashed or froze the server, as DXF text (DXF Reference group codes). */
export function namedHostileDxf(): { name: string; file: Buffer }[] {
  const doc = (entities: ReturnType<typeof entity>[]) => Buffer.from(dxfDocument({ insunits: 4, entities }));
  // SPLINE: 70 flags, 71 degree, 72 knots, 73 control points, 40 knot values, 10/20/30 control points.
  const spline = (pts: number[][], knots: number[]) =>
    entity('SPLINE', '0', [70, 8], [71, 3], [72, knots.length], [73, pts.length], ...knots.map((k) => [40, k] as const), ...pts.flatMap(([x, y]) => [[10, x!], [20, y!], [30, 0]] as const));
  return [
    { name: 'ellipse major axis 1e12', file: doc([entity('ELLIPSE', '0', [10, 0], [20, 0], [30, 0], [11, 1e12], [21, 0], [31, 0], [40, 0.5], [41, 0], [42, 2 * Math.PI])]) },
    { name: 'lwpolyline claiming 999,999,999 vertices', file: doc([entity('LWPOLYLINE', '0', [90, 999_999_999], [70, 1], [10, 0], [20, 0], [10, 1], [20, 1])]) },
    { name: 'circle radius 1e12', file: doc([circle('FX-ST', 0, 0, 1e12)]) },
    { name: 'circle radius 99,999 (inside the limit)', file: doc([circle('FX-ST', 0, 0, 99_999)]) },
    { name: 'spline with control points at 1e9', file: doc([spline([[0, 0], [1e9, 1e9], [-1e9, 1e9], [1, 0]], [0, 0, 0, 0, 1, 1, 1, 1])]) },
    { name: 'spline with wild control points inside the limit', file: doc([spline([[0, 0], [99_000, 99_000], [-99_000, 99_000], [99_000, -99_000], [1, 0]], [0, 0, 0, 0, 1e-12, 1, 1, 1, 1])]) },
    { name: 'ellipse axis ratio 1e-12', file: doc([entity('ELLIPSE', '0', [10, 0], [20, 0], [30, 0], [11, 90_000], [21, 0], [31, 0], [40, 1e-12], [41, 0], [42, 2 * Math.PI])]) },
    { name: 'lwpolyline with bulges of 1e12', file: doc([lwpolyline('0', true, [[0, 0, 1e12], [1, 0, -1e12], [1, 1, 1e12]])]) },
    { name: 'insert scaled 1e12', file: Buffer.from(dxfDocument({ insunits: 4, blocks: [{ name: 'B', entities: [circle('0', 0, 0, 1)] }], entities: [entity('INSERT', '0', [2, 'B'], [10, 0], [20, 0], [30, 0], [41, 1e12], [42, 1e12])] })) },
    { name: 'minsert 10,000 × 10,000', file: Buffer.from(dxfDocument({ insunits: 4, blocks: [{ name: 'B', entities: [circle('0', 0, 0, 1)] }], entities: [entity('INSERT', '0', [2, 'B'], [10, 0], [20, 0], [30, 0], [70, 10_000], [71, 10_000], [44, 1], [45, 1])] })) },
    // dxf-parser 1.1.2 steps back two groups at an unknown code inside a vertex: after a 10 it loops for ever.
    { name: 'lwpolyline vertex x followed by group 330', file: doc([entity('LWPOLYLINE', '0', [90, 2], [70, 0], [10, 0], [20, 0], [10, 1], [330, 'AB'], [20, 1])]) },
    { name: 'layer with control characters', file: doc([circle('FX\u0001ST\u007f', 0, 0, 5)]) },
    { name: 'only a header', file: Buffer.from('  0\nSECTION\n  2\nHEADER\n  0\nENDSEC\n  0\nEOF\n') },
    { name: 'binary noise', file: Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256)) },
  ];
}

/** DXF text with one structural mutation: a number line replaced, lines dropped, repeated or swapped, a cut, a splice. */
export function mutateDxf(rng: Rng, seed: Buffer): Buffer {
  const lines = seed.toString('latin1').split(/\r?\n/);
  const n = 1 + rng.int(4);
  for (let k = 0; k < n; k++) {
    const i = rng.int(lines.length);
    switch (rng.int(8)) {
      case 0: // a value line that is a number becomes a hostile number
        for (let j = i | 1; j < lines.length; j += 2) if (/^\s*-?[\d.]+(e[+-]?\d+)?\s*$/i.test(lines[j]!)) { lines[j] = String(rng.pick([...HOSTILE_NUMBERS, ...HOSTILE_NUMBER_TEXT])); break; }
        break;
      case 1: lines.splice(i, 1 + rng.int(3)); break;
      case 2: lines.splice(i, 0, ...lines.slice(i, i + 2 + 2 * rng.int(40))); break;
      case 3: lines.length = Math.max(1, i); break;
      case 4: lines[i] = rng.pick(['  0', ' 90', ' 10', '999', 'SECTION', 'ENDSEC', 'EOF', 'LWPOLYLINE', 'SPLINE', 'INSERT', ' 2', '-1', 'x']); break;
      case 5: lines[i] = rng.pick(HOSTILE_TEXT).slice(0, 300); break;
      case 6: { const j = rng.int(lines.length); [lines[i], lines[j]] = [lines[j]!, lines[i]!]; break; }
      default: // a group 90 vertex count or 73 control-point count claims far more
        for (let j = i; j < lines.length - 1; j++) if (/^\s*(90|73|72|71|70)\s*$/.test(lines[j]!)) { lines[j + 1] = String(rng.pick([0, -1, 3, 999_999_999, 2 ** 31, 50_001])); break; }
    }
  }
  return Buffer.from(lines.join(rng.next() < 0.2 ? '\r\n' : '\n'), 'latin1');
}

/** Common byte-level mutations: flips, random bytes, truncation, a repeated chunk. */
export function mutateBytes(rng: Rng, seed: Buffer, tailBias = false): Buffer {
  let b = Buffer.from(seed);
  const n = 1 + rng.int(6);
  for (let k = 0; k < n; k++) {
    // Half of the changes land in the last 256 bytes: the ZIP central directory and end record.
    const at = tailBias && rng.next() < 0.5 ? Math.max(0, b.length - 1 - rng.int(256)) : rng.int(b.length);
    switch (rng.int(5)) {
      case 0: b[at] = b[at]! ^ (1 << rng.int(8)); break;
      case 1: b[at] = rng.pick([0, 0xff, 0x7f, 0x80]); break;
      case 2: b = b.subarray(0, Math.max(0, at)); break;
      case 3: b = Buffer.concat([b.subarray(0, at), b.subarray(at, at + 1 + rng.int(512)), b.subarray(at)]); break;
      default: if (b.length >= 4) b.writeUInt32LE(rng.pick([0xffffffff, 0, 0x7fffffff, b.length * 2]) >>> 0, Math.min(at, b.length - 4)); break;
    }
    if (b.length === 0) break;
  }
  return b;
}

/** Sheet XML edits a crafted workbook makes (ECMA-376 Part 1, §18.3): merges, far rows, bad indexes. */
const SHEET_EDITS: Array<(xml: string, rng: Rng) => string> = [
  (x) => x.replace(/<\/sheetData>/, '</sheetData><mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells>').replace(/<mergeCells count="\d+">(.*?)<\/mergeCells>(.*?<mergeCells)/s, '$2'),
  (x) => x.replace(/<\/sheetData>/, `</sheetData><mergeCells count="2000">${Array.from({ length: 2000 }, (_, i) => `<mergeCell ref="A${i * 2 + 30}:B${i * 2 + 30}"/>`).join('')}</mergeCells>`),
  (x) => x.replace(/<\/sheetData>/, '<row r="1048576"><c r="XFD1048576" t="n"><v>1</v></c></row></sheetData>'),
  (x) => x.replace(/<c r="([A-Z]+2)"[^>]*>.*?<\/c>/, '<c r="$1" t="s"><v>999999</v></c>'),
  (x) => x.replace(/<c r="([A-Z]+3)"[^>]*>.*?<\/c>/, '<c r="$1" t="e"><v>#REF!</v></c>'),
  (x) => x.replace(/<c r="([A-Z]+2)"[^>]*>.*?<\/c>/, '<c r="$1"><f>1/0</f></c>'),
  (x) => x.replace(/<sheetData>/, '<cols><col min="1" max="16384" width="9"/></cols><sheetData>'),
  (x) => x.replace(/<c r="([A-Z]+)(\d+)"/, '<c r="ZZZZ$2"'),
  (x, rng) => x.replace(/<v>([^<]*)<\/v>/g, (m) => (rng.next() < 0.3 ? `<v>${rng.pick(HOSTILE_NUMBER_TEXT)}</v>` : m)),
  (x, rng) => x.replace(/<t( [^>]*)?>([^<]*)<\/t>/g, (m, a, v) => (rng.next() < 0.3 ? `<t${a ?? ''}>${rng.pick(['&#1;', 'A&#x7f;B', '&lt;&gt;', v + v])}</t>` : m)),
  (x) => x.slice(0, Math.floor(x.length / 2)),
  (x) => x.replace(/<row /, '<row r="0" '),
];

async function rezip(seed: Buffer, edit: (name: string, text: string) => string | null): Promise<Buffer> {
  const zip = await JSZip.loadAsync(seed);
  for (const name of Object.keys(zip.files)) {
    if (zip.files[name]!.dir) continue;
    const text = await zip.file(name)!.async('string');
    const out = edit(name, text);
    if (out === null) zip.remove(name);
    else if (out !== text) zip.file(name, out);
  }
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
}

/** A workbook with one crafted part: a sheet edit, a part removed, content types or rels broken. */
export async function mutateXlsx(rng: Rng, seed: Buffer): Promise<Buffer> {
  const mode = rng.int(10);
  if (mode < 4) return mutateBytes(rng, seed, true);
  if (mode < 8) {
    const edit = rng.pick(SHEET_EDITS);
    return rezip(seed, (name, text) => (/^xl\/worksheets\/sheet1\.xml$/.test(name) ? edit(text, rng) : text));
  }
  const part = rng.pick(['xl/workbook.xml', 'xl/_rels/workbook.xml.rels', '[Content_Types].xml', 'xl/styles.xml', 'xl/sharedStrings.xml', 'xl/worksheets/sheet1.xml']);
  return rezip(seed, (name, text) => (name === part ? (rng.next() < 0.5 ? null : text.replace(/"[^"]*"/g, '"x"')) : text));
}

/** Workbooks that once crashed the server or were refused with a library's message. */
export async function namedHostileXlsx(seed: Buffer): Promise<{ name: string; file: Buffer }[]> {
  const sheet = (f: (x: string) => string) => rezip(seed, (name, text) => (name === 'xl/worksheets/sheet1.xml' ? f(text) : text));
  return [
    { name: 'merge A1:XFD1048576', file: await sheet((x) => x.replace(/<mergeCells[^]*?<\/mergeCells>/, '').replace(/<\/sheetData>/, '</sheetData><mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells>')) },
    { name: 'openpyxl workbook with comments', file: fixture('xlsx/components-openpyxl-comments.xlsx') },
    { name: 'bars workbook with comments (openpyxl)', file: fixture('xlsx/bars-openpyxl-comments.xlsx') },
    { name: 'zip with its central directory offset past the end', file: (() => { const b = Buffer.from(seed); b.writeUInt32LE(0x7fffffff, b.length - 6); return b; })() },
    { name: 'zip with its entry count at 65,535', file: (() => { const b = Buffer.from(seed); b.writeUInt16LE(0xffff, b.length - 12); b.writeUInt16LE(0xffff, b.length - 14); return b; })() },
    { name: 'end record only', file: Buffer.from('504b0304' + '504b0506' + '00'.repeat(18), 'hex') },
  ];
}

export const xlsxFixtures = () => ['xlsx/components-openpyxl.xlsx', 'xlsx/components-libreoffice.xlsx', 'xlsx/components-openpyxl-comments.xlsx', 'xlsx/bars-openpyxl-comments.xlsx'].map(fixture);

// ---------- JSON ----------

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

const HOSTILE_VALUES: Json[] = [null, true, '', [], {}, ...HOSTILE_NUMBERS, ...HOSTILE_TEXT.slice(0, 12), JSON.parse('{"__proto__": {"x": 1}}') as Json, [[[[[[]]]]]]];

/** Every path into a JSON value. */
function paths(v: Json, at: (string | number)[] = [], out: (string | number)[][] = []): (string | number)[][] {
  out.push(at);
  if (out.length > 4000 || at.length > 40) return out;
  if (Array.isArray(v)) v.slice(0, 50).forEach((x, i) => paths(x, [...at, i], out));
  else if (v && typeof v === 'object') for (const k of Object.keys(v)) paths(v[k]!, [...at, k], out);
  return out;
}

/** One to three edits of a valid body: a value replaced by a hostile one, a key dropped, an array grown past its limit. */
export function mutateJson(rng: Rng, body: Json): Json {
  let root: Json = structuredClone(body);
  const n = 1 + rng.int(3);
  for (let k = 0; k < n; k++) {
    const all = paths(root);
    const p = rng.pick(all);
    // Hostile values are cloned: a later edit must never reach the shared list (or make a cycle).
    const hostile = () => structuredClone(rng.pick(HOSTILE_VALUES));
    if (p.length === 0) { root = hostile(); continue; }
    let parent = root as Record<string | number, Json>;
    for (const key of p.slice(0, -1)) parent = parent[key] as Record<string | number, Json>;
    const key = p[p.length - 1]!;
    const cur = parent[key]!;
    const op = rng.int(6);
    if (op <= 2) parent[key] = typeof cur === 'number' && rng.next() < 0.6 ? rng.pick(HOSTILE_NUMBERS) * (rng.next() < 0.5 ? -1 : 1) : hostile();
    else if (op === 3) { if (Array.isArray(parent)) parent.splice(Number(key), 1); else delete parent[key]; }
    else if (op === 4 && Array.isArray(cur) && cur.length) {
      const len = rng.pick([201, 1_001, 5_001, 20_001]);
      parent[key] = Array.from({ length: len }, (_, i) => structuredClone(cur[i % cur.length]!));
    } else if (typeof cur === 'string') parent[key] = cur + rng.pick(HOSTILE_TEXT).slice(0, 200);
    else parent[key] = hostile();
  }
  return root;
}

/** A posted part program of the supported subset (G-code words: NISTIR 6556; canned cycles: LinuxCNC G-code reference). */
export function gcodeSeeds(): Buffer[] {
  return [
    ['%', 'O1000 (BRACKET)', 'G20 G17 G40 G49 G80 G90', 'T4 M6', 'S8000 M3', 'G54', 'G0 X0 Y0', 'G43 H4 Z1.0', 'G1 Z-0.1 F20', 'G2 X1 Y0 I0.5 J0 F30', 'G0 Z1', 'T7 M6', 'G43 H7 Z1', 'G81 G98 X0.5 Y0.25 Z-0.3 R0.1 F10', 'G80', 'G91 G28 Z0', 'M30', '%'].join('\n'),
    ['G21 G90 G17', 'T1 M6', 'S2000 M3 M8', 'G54 G0 X10 Y5', 'G43 H1 Z25', 'G1 Z-2 F100', 'G3 X20 Y5 R5', 'G0 Z25', 'M9 M5', 'M2'].join('\n'),
  ].map((t) => Buffer.from(t));
}

/** Programs that must be refused with a line number, and ones that try the size limits. */
export function namedHostileGcode(): { name: string; file: Buffer }[] {
  const head = 'G20 G90 G17\nT1 M6\nG54 G0 X0 Y0\n';
  return [
    ['G92 in the part', `${head}G92 X0 Y0\nM30\n`],
    ['subprogram call', `${head}M98 P2000\nM30\n`],
    ['G68 rotation', `${head}G68 X0 Y0 R45\nM30\n`],
    ['parameters', `${head}#1=5\nG1 X#1 F10\nM30\n`],
    ['G28 in XY', `${head}G28 X0 Y0\nM30\n`],
    ['200,001 lines', head + 'G1 X0.1 F10\n'.repeat(200_001)],
    ['one line of 100,000 characters', `${head}(${'A'.repeat(100_000)})\nM30\n`],
    ['binary', Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256)).toString('latin1')],
    ['coordinate 1e308', `${head}G1 X1e308 F10\nM30\n`],
    ['empty', ''],
  ].map(([name, text]) => ({ name: name!, file: Buffer.from(text!, 'latin1') }));
}

/** A query string from hostile pieces, for the G-code download routes. */
export function hostileQuery(rng: Rng): string {
  const values = ['ngc-g10', 'ngc-g52', 'ext-l20', 'shift-rotate', 'expanded', 'standard', 'extended', 'g10', 'g52', '', 'x'.repeat(5000), '%00', '1,2,3', '1e308,0,0', '-0,-0,-0', 'NaN,1,2', '0,0', '3,7', '999999', '-1', '1.5', 'station', 'tool', '[]', '{}'];
  const keys = ['family', 'dialect', 'mode', 'base', 'first', 'order', 'skip', 'safeZ'];
  const n = 1 + Math.floor(rng.next() * 5);
  return Array.from({ length: n }, () => `${rng.pick(keys)}=${encodeURIComponent(rng.pick(values))}`).join('&');
}
