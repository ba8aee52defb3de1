import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';
import { runRs274 } from '../shared/rs274';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

// One part's program as a CAM post might write it (LinuxCNC G-code reference words): a contour with an arc, then a drilled hole.
const part = [
  '%', 'O1001 (BRACKET)', 'G20 G17 G40 G49 G80 G90', 'G54',
  'T4 M6', 'S9000 M3', 'G0 X-0.1 Y0', 'G43 H4 Z0.2', 'G1 Z-0.05 F30.', 'G1 X2.0', 'G3 X2.5 Y0.5 I0. J0.5', 'G0 Z0.2', 'G91 G28 Z0', 'G90',
  'T7 M6', 'S4000 M3', 'G0 X0.5 Y0.45', 'G43 H7 Z0.2', 'G98 G81 X0.5 Y0.45 Z-0.3 R0.1 F8.', 'G80', 'M30', '%', '',
].join('\n');

describe('whole-table program on the job screen', () => {
  it('a programmer uploads the part program, reads what was read, skips a station and downloads the file by tool', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'programmer');
    const job = (await e2e.db('jobs').orderBy('id').first('id'))!;
    await page.goto(`${e2e.baseUrl}/jobs/${job.id}`);
    const section = page.getByRole('region', { name: 'Whole-table program' });
    await section.getByText('No part program yet').waitFor();

    // A program outside the subset is refused with its line number, on the screen where it was sent.
    await section.getByLabel(/^Part program/).setInputFiles({ name: 'bad.nc', mimeType: 'text/plain', buffer: Buffer.from(part.replace('\nG80\n', '\nG92 X0 Y0\n')) });
    await section.getByRole('button', { name: 'Upload the program' }).click();
    await section.getByText(/^Line 20: G92/).waitFor();

    await section.getByLabel(/^Part program/).setInputFiles({ name: 'bracket.nc', mimeType: 'text/plain', buffer: Buffer.from(part) });
    await section.getByRole('button', { name: 'Upload the program' }).click();
    await section.getByText('T4 → T7').waitFor();
    await section.getByRole('img', { name: /^Tool path at \d+ stations$/ }).waitFor();

    await section.getByLabel('By tool: each tool once, over every station').check();
    await section.getByLabel('Skip station 3').check({ force: true });
    const link = section.getByRole('link', { name: 'Download the whole-table program' });
    const href = (await link.getAttribute('href'))!;
    expect(href).toMatch(/order=tool/);
    // The stations the load list leaves without a bar are skipped already; station 3 is added by hand.
    const empty: number[] = (await (await page.request.get(`${e2e.baseUrl}/api/jobs/1/load-list`)).json()).emptyStations;
    const expected = [...new Set([...empty, 3])].sort((a, b) => a - b);
    expect(new URL(href, e2e.baseUrl).searchParams.get('skip')).toBe(expected.join(','));
    // Tool order: each of the 2 tools changed once; station order: at every station that runs.
    const running = (await (await page.request.get(`${e2e.baseUrl}/api/jobs/1`)).json()).stationsUsed.length - expected.length;
    expect(await section.getByTestId('tool-changes').textContent()).toBe(`Tool changes a cycle: 2 by tool, ${2 * running} by station — tool order saves ${2 * running - 2}.`);
    const res = await page.request.get(`${e2e.baseUrl}${href}`);
    expect(res.status()).toBe(200);
    const text = await res.text();
    expect(text).toContain(`(SKIPPED STATIONS: ${expected.join(' ')})`);
    // LinuxCNC's interpreter reads the downloaded file without an error line.
    expect(runRs274(text, [{ t: 4, z: 1.2, d: 0.25 }, { t: 7, z: 2.1, d: 0.201 }]).errors).toEqual([]);

    // A safe Z below the job's least is said beside the field, and no link is offered.
    await section.getByLabel(/^Safe Z above/).fill('0.1');
    await section.getByText(/Safe Z must be at least/).waitFor();
    expect(await link.count()).toBe(0);
    await page.close();
  });
});
