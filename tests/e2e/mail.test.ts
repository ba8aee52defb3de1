import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './browser';

let e2e: E2E;
beforeAll(async () => { e2e = await startE2E(); });
afterAll(async () => { await e2e?.close(); });

describe('invitations and resets in a real browser', () => {
  it('an admin invites, reads the mail under Outbox, and the invited user sets a password and signs in', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page, 'admin');
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
    const invite = page.locator('form', { has: page.getByRole('heading', { name: 'Invite a user' }) });
    await invite.getByLabel('E-mail address').fill('quinn.turner@example.com');
    await invite.getByLabel('Name').fill('Quinn Turner');
    await invite.getByLabel('Role').selectOption('operator');
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText('Invitation sent to quinn.turner@example.com.').waitFor();
    await page.getByRole('row', { name: /quinn\.turner@example\.com/ }).getByText('invited, no password yet').waitFor();

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click();
    const mail = page.getByRole('article', { name: /Avery Admin invited you to Gridset/ });
    await mail.waitFor();
    expect(await mail.textContent()).toContain('quinn.turner@example.com');
    const link = await mail.getByRole('link', { name: /\/set-password\?token=/ }).getAttribute('href');
    expect(link).toMatch(/^http:\/\/localhost:3000\/set-password\?token=[A-Za-z0-9_-]{43}$/);

    // The link names the configured public address; open the same path on this test server, signed out.
    await e2e.context.clearCookies();
    await page.goto(`${e2e.baseUrl}${new URL(link!).pathname}${new URL(link!).search}`);
    await page.getByRole('heading', { name: 'Set your password' }).waitFor();
    await page.getByLabel('New password').fill('quinn-picks-this');
    await page.getByLabel('Type it again').fill('quinn-picks-this');
    await page.getByRole('button', { name: 'Set password' }).click();
    await page.getByText('Your password is set.').waitFor();
    await page.getByRole('link', { name: 'Go to sign-in' }).click();
    await page.getByLabel('E-mail address').fill('quinn.turner@example.com');
    await page.getByLabel('Password').fill('quinn-picks-this');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => page.getByTestId('signed-in-user').textContent()).toContain('Quinn Turner');
    expect(await page.getByRole('link', { name: 'Outbox' }).count()).toBe(0);
    await page.close();
  });

  it('the forgot-password page says the same sentence for any address', async () => {
    const page = await e2e.newPage();
    await e2e.context.clearCookies();
    for (const email of ['nobody-at-all@example.com', 'operator@gridset.test']) {
      await page.goto(`${e2e.baseUrl}/sign-in`);
      await page.getByRole('link', { name: 'Forgot your password?' }).click();
      await page.getByRole('heading', { name: 'Forgot your password?' }).waitFor();
      expect(await page.getByText('a link is on its way').count()).toBe(0);
      await page.getByLabel('E-mail address').fill(email);
      await page.getByRole('button', { name: 'Send me a link' }).click();
      await page.getByText('If that address has an account, a link is on its way.').waitFor();
    }
    // Only the address with an account got mail (sent after the answer, so wait for it).
    await expect.poll(() => e2e.db('outbox').where({ subject: 'Reset your Gridset password' }).pluck('to')).toEqual(['operator@gridset.test']);
    await page.close();
  });
});
