// Each role's main work at a desk (1440 × 900) and on a phone (390 × 844), in Chromium: the page never
// scrolls sideways and no element reaches past the screen's edge, not even inside a scroller (WCAG 2.2,
// 1.4.10 Reflow; 390 px is a common phone width, common practice). The template editor at both sizes
// is in templates.test.ts, the job page at the machine in job-machine.test.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/auth';
import { apiJson, elementsWiderThanScreen, startE2E, type E2E } from './browser';

let e2e: E2E;
let draft: number;
beforeAll(async () => {
  e2e = await startE2E();
  const page = await e2e.newPage();
  await e2e.signIn(page, 'programmer');
  draft = (await apiJson(page, e2e.baseUrl, 'POST', '/api/templates/1/versions', { from: 1 })).version as number;
  await page.close();
}, 60_000);
afterAll(async () => { await e2e?.close(); });

// What each role comes to do (README, "Roles").
const MAIN: [Role, string[]][] = [
  ['programmer', ['/', '/templates', '/jobs', '/jobs/1', '/templates/1/versions/DRAFT']],
  ['lead', ['/', '/naming', '/catalog/components', '/catalog/components/1', '/catalog/plates/1', '/reviews', '/settings']],
  ['reviewer', ['/', '/reviews', '/templates/1/compare?from=1&to=DRAFT']],
  ['operator', ['/', '/jobs/1', '/stock-check', '/api/jobs/1/setup-sheet.html']],
  ['admin', ['/', '/admin/users', '/audit', '/admin/outbox']],
];

describe("each role's main screens fit the screen", () => {
  for (const [width, height] of [[1440, 900], [390, 844]] as const) {
    for (const [role, urls] of MAIN) {
      it(`${role} at ${width} × ${height}`, async () => {
        const page = await e2e.newPage();
        await page.setViewportSize({ width, height });
        await e2e.signIn(page, role);
        for (const url of urls.map((u) => u.replace('DRAFT', String(draft)))) {
          await page.goto(`${e2e.baseUrl}${url}`, { waitUntil: 'networkidle' });
          await page.getByRole('heading', { level: 1 }).first().waitFor();
          expect(await elementsWiderThanScreen(page), `${role} ${url} at ${width} px`).toEqual([]);
        }
        await page.close();
      }, 60_000);
    }
  }
});
