import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { parse as parseCsv } from 'csv-parse/sync';
import DxfParser from 'dxf-parser';
import { parseString as parseDxfIndependent } from 'dxf';
import { parse as parseSvg, type INode } from 'svgson';
import JSZip from 'jszip';
import { SaxesParser } from 'saxes';
import { chromium, type Browser } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../e2e/browser';
import { makeTestApp, type Agent, type TestApp, bodyBytes } from './test-app';
import { runRs274, type Canon } from '../shared/rs274';
import { generatePartProgram } from '../bench/generate-program';

/**
 * Files written from a version that is not released carry a mark at their top naming the state and
 * the content hash; a released version's files carry none. Each file is read back by a reader that is
 * not Gridset's: LinuxCNC's rs274 for G-code, exceljs for XLSX, csv-parse for CSV, dxf-parser and the
 * `dxf` package for DXF, svgson for SVG, and for the setup sheet saxes (as XML) and Chromium's HTML
 * parser (DOMParser, the WHATWG HTML parsing algorithm). The metric demo template's v1 is released; its v2 is a draft
 * copied from it, so both hold the same stations and the same content hash, and the files differ only
 * by the mark.
 */

let t: TestApp;
let programmer: Agent;
let lead: Agent;
let operator: Agent;
let hash: string;
let browser: Browser;
beforeAll(async () => {
  [t, browser] = await Promise.all([makeTestApp(), chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS })]);
  [programmer, lead, operator] = await Promise.all([t.agent('programmer'), t.agent('lead'), t.agent('operator')]);
  const draft = (await programmer.post('/api/templates/2/versions', { from: 1 }).expect(201)).body;
  expect(draft).toMatchObject({ version: 2, state: 'draft' });
  hash = draft.contentHash;
  expect((await operator.get('/api/templates/2/versions/1').expect(200)).body).toMatchObject({ state: 'released', contentHash: hash });
}, 60_000);
afterAll(async () => { await Promise.all([t?.close(), browser?.close()]); });

const DRAFT = '/api/templates/2/versions/2';
const RELEASED = '/api/templates/2/versions/1';

/** A mark says the version is not released and names its state and content hash (the version's own answer). */
const expectMark = (text: string | undefined, state: string, contentHash = hash) => {
  expect(text).toMatch(/NOT RELEASED/);
  expect(text).toContain(state.toUpperCase());
  expect(text).toContain(contentHash);
};

/** One element of the setup sheet as saxes read it: its name, attributes, its own text and its child elements. */
interface El { name: string; attributes: Record<string, string>; text: string; children: El[] }
/**
 * The setup sheet read by saxes (the streaming XML reader exceljs depends on; no HTML reader is
 * installed). React's renderToStaticMarkup writes well-formed markup (void elements closed, text and
 * attributes escaped); the HTML5 doctype, which has no XML form (WHATWG HTML, "The DOCTYPE"), is
 * dropped first. A sheet that is not well formed fails here.
 */
function readSheet(html: string): El {
  expect(html.slice(0, 15).toLowerCase()).toBe('<!doctype html>');
  const stack: El[] = [{ name: '#document', attributes: {}, text: '', children: [] }];
  const parser = new SaxesParser();
  parser.on('opentag', (tag) => {
    const el: El = { name: tag.name, attributes: tag.attributes as Record<string, string>, text: '', children: [] };
    stack.at(-1)!.children.push(el);
    stack.push(el);
  });
  parser.on('text', (t) => { for (const el of stack) el.text += t; });
  parser.on('closetag', () => { stack.pop(); });
  parser.write(html.slice(15)).close();
  return stack[0]!.children[0]!;
}
const child = (el: El, name: string) => el.children.find((c) => c.name === name)!;
/** The sheet's draft mark: the first element in the body, the one that carries the mark's class. */
const sheetMark = (html: string) => {
  const body = child(readSheet(html), 'body');
  const first = body.children[0]!;
  return { first, marks: body.children.filter((c) => /\bdraft-mark\b/.test(c.attributes.class ?? '')), footer: child(body, 'footer'), title: child(child(readSheet(html), 'head'), 'title') };
};

const text = async (r: import('supertest').Test) => ((await bodyBytes(r).expect(200)).body as Buffer).toString('utf8');

/** rs274's canonical commands less the comments, the part that moves or sets the machine. */
const working = (canon: Canon[]) => canon.filter((c) => c.kind !== 'COMMENT').map((c) => `${c.kind}(${c.text})`);
/** COMMENT("…") as rs274 prints it (LinuxCNC canon: a comment is passed on as one command). */
const comments = (canon: Canon[]) => canon.filter((c) => c.kind === 'COMMENT').map((c) => c.text.replace(/^"|"$/g, ''));

describe('G-code from a draft: the mark is the first comment and rs274 still runs the file', () => {
  it.each([
    ['ngc-g52', 'family=ngc-g52'],
    ['ngc-g10', 'family=ngc-g10&base=-400,-250,-300.5'],
  ])('%s', async (_family, query) => {
    const draft = await text(operator.get(`${DRAFT}/offsets.nc?${query}`));
    const released = await text(operator.get(`${RELEASED}/offsets.nc?${query}`));
    // The first line that is a comment: RS274/NGC comments are in parentheses (NISTIR 6556, "Comments and Messages").
    expectMark(draft.split('\n').find((l) => l.startsWith('(')), 'draft');
    const d = runRs274(draft, []);
    const r = runRs274(released, []);
    expect(d.errors).toEqual([]);
    expect(r.errors).toEqual([]);
    expectMark(comments(d.canon)[0], 'draft');
    expect(comments(r.canon).some((c) => /NOT RELEASED/.test(c))).toBe(false);
    // The mark is only a comment: the interpreter does the same work for both files.
    expect(working(d.canon)).toEqual(working(r.canon));
    expect(working(d.canon).some((c) => c.startsWith('SET_G5X_OFFSET') || c.startsWith('SET_G92_OFFSET'))).toBe(true);
  });

  it('a percent-framed family keeps % first and the mark as the first comment (common practice for tape files)', async () => {
    const lines = (await text(operator.get(`${DRAFT}/offsets.nc?family=ext-l20&base=0,0,0`))).split('\n');
    expect(lines[0]).toBe('%');
    expectMark(lines[1], 'draft');
    expect(lines[1]).toMatch(/^\(.*\)$/);
  });
});

describe('spreadsheets from a draft', () => {
  it('CSV: csv-parse reads the mark as the first record, then the header and the same rows as the released file', async () => {
    const draft = parseCsv(await text(operator.get(`${DRAFT}/stations.csv`))) as string[][];
    const released = parseCsv(await text(operator.get(`${RELEASED}/stations.csv`))) as string[][];
    expectMark(draft[0]![0], 'draft');
    // csv-parse holds every record to the first one's field count unless told otherwise (csv-parse, option relax_column_count).
    expect(draft[0]).toHaveLength(released[0]!.length);
    expect(draft.slice(1)).toEqual(released);
    expect(released[0]![0]).toBe('station');
  });

  it('XLSX: exceljs reads a banner row above the header, frozen with it, and the mark first on the About sheet', async () => {
    const read = async (url: string) => {
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load((await bodyBytes(operator.get(url)).expect(200)).body as Parameters<typeof wb.xlsx.load>[0]);
      return wb;
    };
    const draft = await read(`${DRAFT}/stations.xlsx`);
    const released = await read(`${RELEASED}/stations.xlsx`);
    const ds = draft.getWorksheet('Stations')!;
    const rs = released.getWorksheet('Stations')!;
    expectMark(ds.getCell('A1').text, 'draft');
    expect(ds.getCell('A1').isMerged).toBe(true);
    expect(ds.getCell('A2').text).toBe('Station');
    expect(ds.views[0]).toMatchObject({ state: 'frozen', ySplit: 2 });
    expect(rs.getCell('A1').text).toBe('Station');
    expect(rs.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
    // Station rows: the same numbers, one row lower.
    expect(ds.rowCount).toBe(rs.rowCount + 1);
    for (let r = 2; r <= rs.rowCount; r++) expect(ds.getRow(r + 1).values).toEqual(rs.getRow(r).values);
    const about = draft.getWorksheet('About')!;
    expectMark(about.getCell('B1').text, 'draft');
    expect(about.getCell('A1').text).toMatch(/not released/i);
    const aboutReleased = released.getWorksheet('About')!;
    const releasedText = aboutReleased.getSheetValues().flat().join(' ');
    expect(releasedText).not.toMatch(/NOT RELEASED/i);
    expect(releasedText).toContain(hash);
  });
});

describe('drawings from a draft', () => {
  it('DXF: one TEXT on its own layer holds the mark, above the plate, read alike by dxf-parser and dxf', async () => {
    const body = await text(operator.get(`${DRAFT}/drawing.dxf`));
    const parsed = new DxfParser().parseSync(body)!;
    const marks = parsed.entities.filter((e) => e.layer === 'GRID-DRAFT') as unknown as { type: string; text: string; startPoint: { y: number } }[];
    expect(marks).toHaveLength(1);
    expect(marks[0]!.type).toBe('TEXT');
    expectMark(marks[0]!.text, 'draft');
    expect(Object.keys(parsed.tables.layer.layers)).toContain('GRID-DRAFT');
    // Above every grid hole, so it covers no part of the plate's drawing.
    const holes = parsed.entities.filter((e) => e.type === 'CIRCLE' && e.layer === 'GRID-HOLES') as unknown as { center: { y: number }; radius: number }[];
    expect(marks[0]!.startPoint.y).toBeGreaterThan(Math.max(...holes.map((h) => h.center.y + h.radius)));
    const second = parseDxfIndependent(body).entities.filter((e: { layer: string }) => e.layer === 'GRID-DRAFT') as { type: string; string: string }[];
    expect(second.map((e) => e.type)).toEqual(['TEXT']);
    expect(second[0]!.string).toBe(marks[0]!.text);
    const released = new DxfParser().parseSync(await text(operator.get(`${RELEASED}/drawing.dxf`)))!;
    expect(released.entities.filter((e) => e.layer === 'GRID-DRAFT')).toEqual([]);
    expect(released.entities.length).toBe(parsed.entities.length - 1);
  });

  it('SVG: svgson finds the mark as a text of the drawing and in its title', async () => {
    const find = (n: INode, pred: (x: INode) => boolean): INode[] => [...(pred(n) ? [n] : []), ...n.children.flatMap((c) => find(c, pred))];
    const textOf = (n: INode): string => (n.type === 'text' ? n.value : n.children.map(textOf).join(''));
    const draft = await parseSvg(await text(operator.get(`${DRAFT}/drawing.svg`)));
    const layer = find(draft, (n) => n.attributes['data-layer'] === 'GRID-DRAFT');
    expect(layer).toHaveLength(1);
    expectMark(textOf(find(layer[0]!, (n) => n.name === 'text')[0]!), 'draft');
    expectMark(textOf(find(draft, (n) => n.name === 'title')[0]!), 'draft');
    const released = await parseSvg(await text(operator.get(`${RELEASED}/drawing.svg`)));
    expect(find(released, (n) => n.attributes['data-layer'] === 'GRID-DRAFT')).toEqual([]);
    expect(textOf(released)).not.toMatch(/NOT RELEASED/);
  });
});

describe('a job whose version was retired after it was made', () => {
  it('marks its whole-table program and the package offsets once the version is retired; rs274 still runs it', async () => {
    const job = (await programmer.post('/api/jobs', {
      name: 'Retired run', partNumber: 'BR-1001', partRevision: 'B', templateId: 1, version: 1,
      stock: { width: 1, thickness: 0.5, length: 2.75, material: '6061-T6' }, carrier: 0.25, clearance: 0.03, minBite: 0.06, cycleMinutes: 13, loadMinutes: 10,
    }).expect(201)).body;
    await programmer.http.post(`/api/jobs/${job.id}/part-program`).set('X-CSRF-Token', programmer.token).attach('file', Buffer.from(generatePartProgram(80)), 'part.nc').expect(200);
    const tools = [1, 2, 3, 4].map((n) => ({ t: n, z: 1 + n / 10, d: 0.25 }));
    const before = await text(operator.get(`/api/jobs/${job.id}/program.nc`));
    const sheetBefore = sheetMark(await text(operator.get(`/api/jobs/${job.id}/setup-sheet.html`)));
    expect(sheetBefore.marks).toEqual([]);
    expect(sheetBefore.first.name).toBe('h1');
    expect(sheetBefore.footer.text).not.toMatch(/NOT RELEASED/);
    expect(before).not.toMatch(/NOT RELEASED/);
    const v1 = (await operator.get('/api/templates/1/versions/1').expect(200)).body;
    await lead.post('/api/templates/1/versions/1/retire', {}).expect(200);
    const after = await text(operator.get(`/api/jobs/${job.id}/program.nc`));
    expectMark(after.split('\n').find((l) => l.startsWith('(')), 'retired', v1.contentHash);
    const b = runRs274(before, tools);
    const a = runRs274(after, tools);
    expect(a.errors).toEqual([]);
    expectMark(comments(a.canon)[0], 'retired', v1.contentHash);
    expect(working(a.canon)).toEqual(working(b.canon));
    const zip = await JSZip.loadAsync((await bodyBytes(operator.get(`/api/jobs/${job.id}/package.zip`)).expect(200)).body as Buffer);
    const offsets = Object.keys(zip.files).find((n) => /^offsets-.*\.nc$/.test(n))!;
    expectMark((await zip.file(offsets)!.async('string')).split('\n').find((l) => l.startsWith('(')), 'retired', v1.contentHash);
    expectMark((await zip.file('stations.csv')!.async('string')).split('\r\n')[0], 'retired', v1.contentHash);
    // The setup sheet, from its own address and from the package: the mark is the body's first element.
    const retired = (await operator.get('/api/templates/1/versions/1').expect(200)).body;
    expect(retired).toMatchObject({ state: 'retired', contentHash: v1.contentHash });
    for (const html of [await text(operator.get(`/api/jobs/${job.id}/setup-sheet.html`)), await zip.file('setup-sheet.html')!.async('string')]) {
      const sheet = sheetMark(html);
      expect(sheet.marks).toHaveLength(1);
      expect(sheet.first).toBe(sheet.marks[0]);
      expectMark(sheet.first.text, retired.state, retired.contentHash);
      expect(sheet.first.attributes).toMatchObject({ 'data-draft-state': retired.state, 'data-content-hash': retired.contentHash });
      // Each printed page's foot and the document's title say it too.
      expectMark(sheet.footer.text, retired.state, retired.contentHash);
      expect(sheet.title.text).toMatch(/^NOT RELEASED/);
    }
  });
});

/** A job on version 1 of a demo template (the released one), stock in the template's unit. */
const newJob = async (templateId: number, stock: { width: number; thickness: number; length: number }, fit: { carrier: number; clearance: number; minBite: number }) =>
  (await programmer.post('/api/jobs', {
    name: `Run on template ${templateId}`, partNumber: `BR-100${templateId}`, partRevision: 'B', templateId, version: 1,
    stock: { ...stock, material: '6061-T6' }, ...fit, cycleMinutes: 13, loadMinutes: 10,
  }).expect(201)).body as { id: number };

/**
 * What Chromium's HTML parser finds in a setup sheet: the body's first element, the banner (if any)
 * with its text and data attributes, the title and the footer. The page is parsed with DOMParser
 * (scripts off in a parsed document), never loaded, so nothing of it runs or fetches.
 */
interface SheetRead { first: string; banner: { text: string; state: string | null; hash: string | null } | null; title: string; footer: string; marks: number }
async function parseInChromium(html: string): Promise<SheetRead> {
  const page = await browser.newPage();
  try {
    return await page.evaluate((source) => {
      const doc = new DOMParser().parseFromString(source, 'text/html');
      const b = doc.querySelector('body > .draft-mark');
      const text = (n: Element | null) => (n?.textContent ?? '').replace(/\s+/g, ' ').trim();
      return {
        first: doc.body.firstElementChild?.className || doc.body.firstElementChild?.tagName.toLowerCase() || '',
        banner: b ? { text: text(b), state: b.getAttribute('data-draft-state'), hash: b.getAttribute('data-content-hash') } : null,
        title: doc.title,
        footer: text(doc.querySelector('footer')),
        marks: (doc.body.textContent ?? '').split('NOT RELEASED').length - 1,
      };
    }, html);
  } finally {
    await page.close();
  }
}

describe('the job setup sheet, read back by Chromium\'s HTML parser', () => {
  it('carries no mark while its version is released, and a banner first in the page once the version is retired', async () => {
    const job = await newJob(2, { width: 20, thickness: 10, length: 60 }, { carrier: 5, clearance: 0.8, minBite: 1.5 });
    const url = `/api/jobs/${job.id}/setup-sheet.html`;
    const released = await parseInChromium(await text(operator.get(url)));
    expect(released.banner).toBeNull();
    expect(released.marks).toBe(0);
    expect(released.first).toBe('h1');
    // The version as the API answers it, after the lead retires it (the lifecycle's one path to a state change).
    await lead.post('/api/templates/2/versions/1/retire', {}).expect(200);
    const v = (await operator.get(RELEASED).expect(200)).body as { state: string; contentHash: string };
    expect(v.state).toBe('retired');
    const retired = await parseInChromium(await text(operator.get(url)));
    expect(retired.first).toBe('draft-mark');
    expectMark(retired.banner?.text, v.state, v.contentHash);
    expect(retired.banner).toMatchObject({ state: v.state, hash: v.contentHash });
    expect(retired.title).toMatch(/^NOT RELEASED/);
    // On paper the footer repeats at the foot of each page (position: fixed in print), so it carries the mark too.
    expectMark(retired.footer, v.state, v.contentHash);
  });
});
