import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import JSZip from 'jszip';
import { STOCK_CHECK_ADVICE } from '../../shared/clamps/reason-text';
import type { Page } from 'playwright-core';
import { apiStatus, startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

// A part outline written by hand as a minimal R12 DXF (ENTITIES only; DXF Reference LINE 10/20/11/21): a 2.5 × 0.9 in
// rectangle with its lower-left corner at (10, 5), and no $INSUNITS, so the unit chosen on the page is the one used.
const line = (x1: number, y1: number, x2: number, y2: number) => `0\nLINE\n8\nPART\n10\n${x1}\n20\n${y1}\n11\n${x2}\n21\n${y2}\n`;
const partDxf = `0\nSECTION\n2\nENTITIES\n${line(10, 5, 12.5, 5)}${line(12.5, 5, 12.5, 5.9)}${line(12.5, 5.9, 10, 5.9)}${line(10, 5.9, 10, 5)}0\nENDSEC\n0\nEOF\n`;

describe('jobs in a real browser', () => {
  let jobUrl = '';

  it('a programmer creates a job on the released bracket template, reads its runtime and gives it a part outline', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' }).click();
    await page.getByRole('heading', { name: 'Jobs', level: 1 }).waitFor();
    const form = page.getByRole('form', { name: 'New job' });

    // An empty form is refused field by field, with the schema's own words beside each field.
    const jobsBefore = Number((await e2e.db('jobs').count({ n: '*' }).first())!.n); // the demo job
    await form.getByRole('button', { name: 'Create job' }).click();
    await form.getByText('Job name is required.').waitFor();
    await form.getByText('Choose a template.').waitFor();
    await form.getByText('Carrier thickness must be a number.').waitFor();
    expect(Number((await e2e.db('jobs').count({ n: '*' }).first())!.n)).toBe(jobsBefore);

    await form.getByLabel('Job name').fill('Bracket run');
    await form.getByLabel('Part number').fill('BR-1001');
    await form.getByLabel('Revision').fill('B');
    await form.getByLabel('Template').selectOption({ label: 'Bracket 1 in bar, 20 up (GP-IN-12x8, in)' });
    // Only released versions are offered; the seed releases v1 of the bracket template.
    expect(await form.getByLabel('Released version').locator('option').allTextContents()).toEqual([expect.stringMatching(/^v1 · released/)]);
    await form.getByLabel(/^Width/).fill('1.000');
    await form.getByLabel(/^Thickness/).fill('0.500');
    await form.getByLabel(/^Length/).fill('2.75');
    await form.getByLabel('Material').fill('6061-T6');
    await form.getByLabel('Carrier thickness').fill('0.25');
    await form.getByLabel('Tool clearance').fill('0.03');
    await form.getByLabel('Minimum bite').fill('0.06');
    await form.getByLabel('Cycle time per station').fill('13');
    await form.getByLabel('Load time').fill('10');
    await form.getByRole('button', { name: 'Create job' }).click();
    await page.waitForURL(/\/jobs\/\d+$/);
    jobUrl = page.url();

    await page.getByRole('heading', { name: 'Bracket run', level: 1 }).waitFor();
    // The stations the 1.000 in stock fits: width held ± the rail's accept window (server/db/seed-demo.ts: JR-1.000 and
    // JR-S4-1.000 take ±0.030 in, JR-1.500 takes ±0.035 in), written out here rather than read from the code under test.
    const jobId = Number(page.url().split('/').at(-1));
    const detail = await (await page.request.get(`${e2e.baseUrl}/api/jobs/${jobId}`)).json();
    const window = (w: number) => (Math.abs(w - 1.5) < 1e-9 ? [1.5 - 0.035, 1.5 + 0.035] : [w - 0.03, w + 0.03]);
    const expectedUsed = (detail.stationList as { number: number; nominalWidth: number | null }[])
      .filter((st) => st.nominalWidth !== null && window(st.nominalWidth)[0]! <= 1 && 1 <= window(st.nominalWidth)[1]!).map((st) => st.number);
    expect(detail.stationList).toHaveLength(20);
    expect(expectedUsed).toHaveLength(12); // 8 of the 20 stations hold 1.500 in (the template's name and notes)
    expect(detail.stationsUsed).toEqual(expectedUsed);
    // Runtime = stations used × cycle + load (common practice): 12 × 13 min + 10 min = 166 min = 2 h 46 min.
    const runtime = page.getByRole('region', { name: 'Runtime of one load' });
    expect(await page.getByTestId('runtime-minutes').textContent()).toBe(`${12 * 13 + 10} min`);
    expect(await runtime.textContent()).toContain('2:46 h');
    expect(await runtime.textContent()).toContain('12 stations used × 13 min + 10 min load');
    expect(await page.getByTestId('stations-unused').textContent()).toContain('8 of the template’s 20 stations');
    const stored = await e2e.db('jobs').where({ name: 'Bracket run' }).first();
    expect(stored).toMatchObject({ part_number: 'BR-1001', part_revision: 'B', carrier: 0.25, cycle_minutes: 13, load_minutes: 10 });

    // The outline: the file has no $INSUNITS, so the unit chosen here (in) is used.
    const upload = page.getByRole('form', { name: 'Part outline' });
    // The file is sent once, to be read; the outline is then stored by the file's SHA-256 (JSON, no file).
    const posts: string[] = [];
    page.on('request', (r) => { if (r.method() === 'POST' && /\/api\/(dxf|jobs\/\d+\/outline)/.test(r.url())) posts.push(`${new URL(r.url()).pathname} ${r.headers()['content-type']?.split(';')[0]}`); });
    await upload.getByLabel('DXF file of the part').setInputFiles({ name: 'bracket.dxf', mimeType: 'application/dxf', buffer: Buffer.from(partDxf) });
    await upload.getByLabel('Drawing unit').selectOption('in');
    await upload.getByRole('button', { name: 'Upload the outline' }).click();
    await upload.getByText(/^bracket\.dxf read: \d+ paths? and 0 circles/).waitFor();
    expect(posts).toEqual(['/api/dxf/inspect multipart/form-data', `/api/jobs/${stored.id}/outline/from-inspection application/json`]);
    const part = JSON.parse((await e2e.db('jobs').where({ id: stored.id }).first()).part_outline);
    const xs = part.paths.flatMap((p: { points: { x: number }[] }) => p.points.map((v) => v.x));
    // Datum at the lower-left corner of the extents: x from 0 to 2.5 in.
    expect([Math.min(...xs), Math.max(...xs)]).toEqual([0, 2.5]);
    await page.getByRole('heading', { name: /The part at every station/ }).waitFor();
    const svg = await page.request.get(`${e2e.baseUrl}/api/jobs/${stored.id}/drawing.svg`);
    expect(svg.status()).toBe(200);
    expect(await svg.text()).toContain('data-layer="PART-BR-1001"');

    // 2.5 in along the rail on stops 1.000 in apart: each part runs into the next (2.5 > 1.000), so the page names a problem.
    const problems = page.getByTestId('job-problems');
    await problems.locator('li[data-code="part-overlap"]').waitFor();
    expect(await problems.textContent()).toMatch(/stations? \d/);

    // The part can be turned about its datum: the choice is saved with the job.
    await page.getByRole('button', { name: 'Edit job' }).click();
    const edit = page.getByRole('form', { name: 'Edit job' });
    expect(await edit.getByLabel('Part rotation').locator('option').allTextContents()).toHaveLength(4);
    await edit.getByLabel('Part rotation').selectOption('90');
    await edit.getByRole('button', { name: 'Save job' }).click();
    await edit.waitFor({ state: 'detached' });
    expect((await e2e.db('jobs').where({ id: stored.id }).first()).part_rotation).toBe(90);
    await page.close();
  });

  it('an operator opens the job, checks two bars on both rails the job uses, reads both verdicts on A-JR and the caution, and downloads the package', async () => {
    expect(jobUrl).not.toBe('');
    const page = await e2e.newPage();
    await e2e.signIn(page, 'operator');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Jobs' }).click();
    await page.getByRole('link', { name: 'Bracket run' }).click();
    await page.waitForURL(jobUrl);
    await page.getByRole('heading', { name: 'Bracket run', level: 1 }).waitFor();
    await page.getByRole('region', { name: /^Jaw rails/ }).waitFor();
    // Everything to read, nothing of the job's own to change.
    expect(await page.getByRole('button', { name: /Edit job|Upload the outline|Replace the outline|Create job/ }).count()).toBe(0);
    expect(await page.getByRole('form', { name: 'Part outline' }).count()).toBe(0);

    // B-JR holds 1.500 in, which the 1.000 in stock does not fit: marked and not offered.
    const railsTable = page.getByRole('region', { name: /^Jaw rails/ });
    expect(await railsTable.locator('tr[data-used="no"]').textContent()).toContain('B-JR');
    expect(await page.getByLabel('Show the check of rail B-JR').isDisabled()).toBe(true);
    await page.getByLabel('Show the check of rail A-JR').check();
    await page.getByRole('heading', { name: /Measured bars/ }).waitFor();
    for (const [row, cells] of [[1, ['1.000', '0.500', '0.020']], [2, ['1.200', '0.500', '0.020']]] as const) {
      await page.getByLabel(`Row ${row} width`).fill(cells[0]);
      await page.getByLabel(`Row ${row} thickness`).fill(cells[1]);
      await page.getByLabel(`Row ${row} corner radius`).fill(cells[2]);
    }
    const posted = page.waitForRequest((r) => r.url().endsWith('/stock-check') && r.method() === 'POST');
    // Both rails the job uses (A-JR, C-JR) are checked in one go, each against its own clamp.
    await page.getByRole('button', { name: 'Check the bars on all 2 rails' }).click();
    // Row 3 was left blank with its automatic id, so it is not a bar; no rail named means every rail the job uses.
    expect((await posted).postDataJSON()).toEqual({
      bars: [{ id: 'B1', width: 1, thickness: 0.5, cornerRadius: 0.02 }, { id: 'B2', width: 1.2, thickness: 0.5, cornerRadius: 0.02 }],
    });
    await page.getByRole('list', { name: 'Sorting list' }).waitFor();

    // JR-1.000's demo clamp (server/db/seed-demo.ts): window −0.030/+0.030 in, slot slop ±0.015 in, top 0.16 in rising 0.5 per unit of d.
    // B1: d = 1.000 − 1.000 = 0 → fits; top 0.16 ≤ carrier − clearance = 0.22; accepted for shifts [−0.015, +0.015], whose middle is 0.
    // B2: d = 0.2 > 0.03 → too wide; top 0.16 + 0.5 × 0.2 = 0.26 > 0.22 → clamp above carrier; needs a shift ≥ 0.17 > 0.015 → unusable.
    expect(await page.getByTestId('setting-line').allTextContents()).toEqual(['Setting 1: shift 0.0000 in — bar B1']);
    const table = page.getByRole('table', { name: 'Stock check, bar by bar' });
    const b1 = await table.getByRole('row', { name: /^B1 / }).textContent();
    expect(b1).toContain('accepted');
    expect(b1).toContain('Setting 1');
    const b2 = await table.getByRole('row', { name: /^B2 / }).textContent();
    expect(b2).toContain('too wide');
    expect(b2).toContain('clamp above carrier — collision risk');
    expect(b2).toContain('cannot be used on this rail');
    expect(b2).not.toContain('accepted');
    const unusable = page.getByRole('list', { name: 'Bars that cannot be used on this rail' });
    expect(await unusable.textContent()).toContain('B2');
    await page.getByText(STOCK_CHECK_ADVICE).first().waitFor();
    expect(await page.getByText('Latest check on A-JR:').textContent()).toContain('by Oakley Operator');
    expect(await page.getByTestId('rails-covered').textContent()).toContain('Rails checked: A-JR, C-JR.');

    // The check is kept with the job, by the operator who made it.
    const jobId = Number(jobUrl.split('/').at(-1));
    const checks = await e2e.db('job_stock_checks').where({ job_id: jobId }).select('jaw_placement', 'result');
    expect(checks).toHaveLength(1);
    expect(checks[0].jaw_placement).toBe('A-JR');
    expect(JSON.parse(checks[0].result).unplaceable).toEqual(['B2']);

    // The files for the machine.
    const packageHref = await page.getByRole('link', { name: 'Download job package' }).getAttribute('href');
    const zip = await page.request.get(`${e2e.baseUrl}${packageHref}`);
    expect(zip.status()).toBe(200);
    expect(zip.headers()['content-type']).toContain('application/zip');
    const files = Object.keys((await JSZip.loadAsync(await zip.body())).files);
    expect(files).toEqual(expect.arrayContaining(['manifest.json', 'setup-sheet.html', 'stations.csv', 'stock-check.json']));
    const sheet = page.getByRole('link', { name: 'Print setup sheet' });
    expect(await sheet.getAttribute('target')).toBe('_blank');
    expect((await page.request.get(`${e2e.baseUrl}${await sheet.getAttribute('href')}`)).status()).toBe(200);
    await page.close();
  });

  it('when a lead releases a newer version, the job stays pinned and says so in words, linking to the comparison', async () => {
    expect(jobUrl).not.toBe('');
    const page = await e2e.newPage();
    await e2e.signIn(page, 'lead');
    const csrf = (await (await page.request.get(`${e2e.baseUrl}/api/auth/csrf`)).json()).token as string;
    const draft = await page.request.post(`${e2e.baseUrl}/api/templates/1/versions`, { data: { from: 1 }, headers: { 'X-CSRF-Token': csrf } });
    expect(draft.status()).toBe(201);
    const n = (await draft.json()).version as number;
    expect((await page.request.post(`${e2e.baseUrl}/api/templates/1/versions/${n}/release`, { data: {}, headers: { 'X-CSRF-Token': csrf } })).status()).toBe(200);

    await page.goto(`${e2e.baseUrl}/jobs`);
    const badge = page.getByRole('row', { name: /Bracket run/ }).getByRole('link', { name: `newer release v${n}` });
    expect(await badge.getAttribute('href')).toBe(`/templates/1/compare?from=1&to=${n}`);
    await page.goto(jobUrl);
    await page.getByText(`Version ${n} of Bracket 1 in bar, 20 up is released; this job stays pinned to version 1.`).waitFor();
    expect(await page.getByRole('link', { name: `Compare v1 with v${n}` }).getAttribute('href')).toBe(`/templates/1/compare?from=1&to=${n}`);
    // Still pinned: the runtime and the stations are version 1's (12 used × 13 min + 10 min).
    expect(await page.getByTestId('runtime-minutes').textContent()).toBe('166 min');
    await page.close();
  });

  it('a programmer finds the job controls an operator must not, by the same role and name; the operator finds none and the API refuses', async () => {
    // Paired check: each selector finds its control for a programmer first, so a renamed control fails
    // here instead of letting the operator's "finds none" pass. README Roles: "jobs: create and edit"
    // is a lead's or programmer's; an operator records bars and edits load lists only.
    const jobControls = (page: Page) => ({
      edit: page.getByRole('button', { name: 'Edit job' }),
      upload: page.getByRole('button', { name: /^(Upload|Replace) the outline$/ }),
      outlineForm: page.getByRole('form', { name: 'Part outline' }),
    });
    const page = await e2e.newPage();
    const demo = await e2e.db('jobs').where({ name: 'Bracket BR-1001, night run' }).first();
    const countsAs = async (role: 'programmer' | 'operator') => {
      await e2e.signIn(page, role);
      await page.goto(`${e2e.baseUrl}/jobs`);
      await page.getByRole('link', { name: 'Bracket BR-1001, night run' }).waitFor();
      const create = await page.getByRole('button', { name: 'Create job' }).count();
      await page.goto(`${e2e.baseUrl}/jobs/${demo.id}`);
      await page.getByRole('heading', { name: 'Bracket BR-1001, night run', level: 1 }).waitFor();
      await page.getByRole('region', { name: /^Jaw rails/ }).waitFor();
      const c = jobControls(page);
      return { create, edit: await c.edit.count(), upload: await c.upload.count(), outlineForm: await c.outlineForm.count() };
    };
    expect(await countsAs('programmer')).toEqual({ create: 1, edit: 1, upload: 1, outlineForm: 1 });
    expect(await countsAs('operator')).toEqual({ create: 0, edit: 0, upload: 0, outlineForm: 0 });
    const before = await e2e.db('jobs').count({ n: '*' });
    expect(await apiStatus(page, e2e.baseUrl, 'post', '/api/jobs', { name: 'Not mine' })).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'put', `/api/jobs/${demo.id}`, { name: 'Not mine' })).toBe(403);
    expect(await apiStatus(page, e2e.baseUrl, 'post', `/api/jobs/${demo.id}/outline`)).toBe(403);
    expect(await e2e.db('jobs').count({ n: '*' })).toEqual(before);
    await page.close();
  });
});
