import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

/**
 * A shop opens Gridset by the server's name over plain HTTP from another machine. A browser treats
 * only localhost as a secure origin (W3C Secure Contexts, "potentially trustworthy origin"), so here
 * the page comes through a name Chromium resolves to this server: a CSP upgrade-insecure-requests
 * (W3C Upgrade Insecure Requests §3) would send every script to https:// and leave a blank page.
 */
let e2e: E2E;
beforeAll(async () => { e2e = await startE2E({ host: 'gridset-shop.test' }); });
afterAll(async () => { await e2e?.close(); });

describe('on the shop network over plain HTTP', () => {
  it('loads the app through a non-localhost name and signs in', async () => {
    const page = await e2e.newPage();
    const failed: string[] = [];
    // What upgrade-insecure-requests breaks: the page's own scripts, styles and fonts. (Requests the
    // page itself abandons when it moves on, net::ERR_ABORTED, are not failures of the network.)
    page.on('requestfailed', (r) => {
      if (['script', 'stylesheet', 'font', 'document'].includes(r.resourceType()) && r.failure()?.errorText !== 'net::ERR_ABORTED') failed.push(`${r.url()} ${r.failure()?.errorText}`);
    });
    const res = await page.goto(`${e2e.baseUrl}/sign-in`);
    expect(e2e.baseUrl).toMatch(/^http:\/\/gridset-shop\.test:\d+$/);
    expect(res!.headers()['strict-transport-security']).toBeUndefined();
    expect(res!.headers()['content-security-policy']).not.toMatch(/upgrade-insecure-requests/);
    await e2e.signIn(page, 'operator');
    expect(new URL(page.url()).hostname).toBe('gridset-shop.test');
    expect(failed).toEqual([]);
  });
});
