import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { roles } from '../../src/lib/roles.ts';
import { demoAccounts, demoPassword, requireChromium, screenshot, signIn, signInAs, useBrowserSuite, type PageWatch } from './support.ts';

const hasChromium = requireChromium();

const adminNav = ['Users', 'Outbox', 'Audit log'];

describe.skipIf(!hasChromium)('signing in through the browser', () => {
  const suite = useBrowserSuite();
  let page: Page;
  let watch: PageWatch;

  async function openPage(): Promise<Page> {
    ({ page, watch } = await suite.newPage());
    return page;
  }

  async function navNames(current: Page): Promise<string[]> {
    return current.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts();
  }

  for (const role of roles) {
    it(`signs in as the demo ${role} and sees only the nav that role allows`, async () => {
      const current = await openPage();
      await signIn(current, suite.url, role);

      expect(new URL(current.url()).pathname).toBe('/');
      await current.getByRole('button', { name: new RegExp(`^Account: .*, ${role === 'qa' ? 'QA' : role}`, 'i') }).waitFor();
      const names = await navNames(current);
      expect(names).toContain('Home');
      for (const name of adminNav) {
        if (role === 'admin') expect(names).toContain(name);
        else expect(names).not.toContain(name);
      }
      // The devices under test come from the API.
      await current.getByRole('table', { name: 'Devices under test' }).getByRole('row').nth(1).waitFor();
      if (role === 'admin' || role === 'viewer') await screenshot(current, `home-${role}-light`);

      // A role without admin rights gets a friendly refusal, not the page.
      if (role !== 'admin') {
        await current.goto(`${suite.url}/admin/users`);
        await current.getByRole('heading', { name: 'Not available to your role' }).waitFor();
      }
      watch.assertClean();
    });
  }

  it('shows an inline error for a wrong password and stays on the sign-in page', async () => {
    const current = await openPage();
    await current.goto(`${suite.url}/sign-in`);
    await current.getByLabel('E-mail').fill(demoAccounts.engineer);
    await current.getByLabel('Password', { exact: true }).fill('not-the-password');
    await current.getByRole('button', { name: 'Sign in' }).click();
    await current.getByRole('alert').filter({ hasText: 'do not match' }).waitFor();
    expect(new URL(current.url()).pathname).toBe('/sign-in');

    // Empty fields are caught before anything is sent.
    await current.getByLabel('E-mail').fill('');
    await current.getByRole('button', { name: 'Sign in' }).click();
    await current.getByText('Enter an e-mail address').waitFor();
    await screenshot(current, 'sign-in-error-light');
    await current.emulateMedia({ colorScheme: 'dark' });
    await expect.poll(() => current.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await screenshot(current, 'sign-in-error-dark');
    watch.assertClean();
  });

  it('sends a signed-out visitor to sign-in and back to the page asked for', async () => {
    const current = await openPage();
    await current.goto(`${suite.url}/admin/audit`);
    await current.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(current.url()).searchParams.get('next')).toBe('/admin/audit');
    await current.getByLabel('E-mail').fill(demoAccounts.admin);
    await current.getByLabel('Password', { exact: true }).fill(demoPassword);
    await current.getByRole('button', { name: 'Sign in' }).click();
    await current.getByRole('heading', { level: 1, name: 'Audit log' }).waitFor();
    watch.assertClean();
  });

  it('keeps the chosen colour scheme across reloads', async () => {
    const current = await openPage();
    await signIn(current, suite.url, 'engineer');
    await current.getByRole('button', { name: 'Dark colour scheme' }).click();
    expect(await current.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await current.reload();
    await current.getByRole('heading', { level: 1, name: /^Welcome,/ }).waitFor();
    expect(await current.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(true);
    await screenshot(current, 'home-engineer-dark');
    await current.getByRole('button', { name: 'Follow the system colour scheme' }).click();
    expect(await current.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(false);
    watch.assertClean();
  });

  it('lets an admin invite someone who reads the invitation, sets a password and signs in', async () => {
    const current = await openPage();
    const email = `rowan.${Date.now()}@kestrel.example`;
    const password = 'kestrel-tested-42';
    await signIn(current, suite.url, 'admin');

    await current.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
    await current.getByRole('heading', { level: 1, name: 'Users' }).waitFor();
    const form = current.getByRole('form', { name: 'Invite someone' });
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Name').fill('Rowan Test');
    await form.getByLabel('Role').selectOption('qa');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await current.getByRole('status').filter({ hasText: 'Invitation sent' }).waitFor();
    const row = current.getByRole('row').filter({ hasText: email });
    await row.getByText('invite pending').waitFor();
    await screenshot(current, 'users-light');

    await current.getByRole('link', { name: 'Read it in the Outbox' }).click();
    await current.getByRole('heading', { level: 1, name: 'Outbox' }).waitFor();
    await current.getByRole('row').filter({ hasText: email }).first().click();
    await current.getByRole('heading', { level: 2, name: /invited/ }).waitFor();
    await current.emulateMedia({ colorScheme: 'dark' });
    await screenshot(current, 'outbox-dark');
    await current.emulateMedia({ colorScheme: 'light' });
    await current.getByRole('tab', { name: 'Plain text' }).click();
    const inviteLink = current.getByRole('link', { name: /\/invite\// });
    const href = await inviteLink.getAttribute('href');
    expect(href).toMatch(/^\/invite\/.+/);

    // The invitation is for someone else: sign out, then follow the link.
    await current.getByRole('button', { name: /^Account:/ }).click();
    await current.getByRole('menuitem', { name: 'Sign out' }).click();
    await current.getByRole('heading', { name: 'Sign in' }).waitFor();
    await current.goto(`${suite.url}${href}`);
    await current.getByRole('heading', { name: 'Join Parley' }).waitFor();
    expect(await current.getByTestId('invite-email').innerText()).toBe(email);
    await current.getByLabel('Password', { exact: true }).fill(password);
    await current.getByLabel('Repeat the password').fill(password);
    await screenshot(current, 'accept-invite-light');
    await current.getByRole('button', { name: 'Activate account' }).click();
    await current.getByRole('heading', { level: 1, name: 'Welcome, Rowan Test' }).waitFor();
    expect(await navNames(current)).not.toContain('Users');

    // The new password works through the sign-in form too.
    await current.getByRole('button', { name: /^Account:/ }).click();
    await current.getByRole('menuitem', { name: 'Sign out' }).click();
    await current.getByRole('heading', { name: 'Sign in' }).waitFor();
    await signInAs(current, suite.url, email, password);
    await current.getByRole('button', { name: /^Account: Rowan Test, QA/ }).waitFor();
    watch.assertClean();
  });
});
