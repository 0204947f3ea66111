import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed/demo-users';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

const EXPECTED_NAV: Record<string, string[]> = {
  admin: ['Home', 'Programs', 'Library', 'Run files', 'Panel preview', 'Line access', 'Account', 'Users', 'Audit log', 'Outbox'],
  engineer: ['Home', 'Programs', 'Library', 'Run files', 'Panel preview', 'Line access', 'Account'],
  librarian: ['Home', 'Library', 'Account'],
  operator: ['Home', 'Run files', 'Account'],
};

describe('signing in as each demo role in Chromium', () => {
  it.each(DEMO_USERS.filter((u, i, all) => all.findIndex((v) => v.roles[0] === u.roles[0]) === i))('$roles.0 ($email) sees their navigation', async (u) => {
    const page = await h.newPage();
    try {
      await signInAs(page, h.baseUrl, u.email, DEMO_PASSWORD);
      const nav = page.getByRole('navigation', { name: 'Main' });
      const labels = (await nav.getByRole('link').allTextContents()).map((s) => s.trim());
      expect(labels).toEqual(EXPECTED_NAV[u.roles[0]]);
      await page.getByRole('heading', { name: /Welcome/ }).waitFor();
      await page.getByText('Signed in').first().waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/home-${u.roles[0]}.png` });
    } finally {
      await page.close();
    }
  });

  it('a wrong password shows the error and keeps the user on the sign-in page', async () => {
    const page = await h.newPage();
    try {
      await page.goto(`${h.baseUrl}/sign-in`);
      await page.getByLabel('E-mail').fill('ellis@harrowcreek.example');
      await page.getByLabel('Password').fill('not-the-password');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByText(/e-mail or password is not right/).waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await page.screenshot({ path: `${SCREENSHOT_DIR}/sign-in-error.png` });
    } finally {
      await page.close();
    }
  });

  it('the admin creates a user, who then signs in', async () => {
    const page = await h.newPage();
    try {
      await signInAs(page, h.baseUrl, 'ada@harrowcreek.example', DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).click();
      await page.getByRole('button', { name: 'New user' }).click();
      const form = page.getByRole('form', { name: 'New user' });
      await form.getByLabel('Name').fill('Mira Solberg');
      await form.getByLabel('E-mail').fill('mira@harrowcreek.example');
      await form.getByLabel('First password').fill('a-first-password');
      await form.getByLabel('Engineer').uncheck();
      await form.getByLabel('Operator').check();
      await form.getByRole('button', { name: 'Create user' }).click();
      await page.getByRole('cell', { name: 'mira@harrowcreek.example' }).waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/admin-users.png` });
      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.getByRole('heading', { name: 'Sign in' }).waitFor();
      await signInAs(page, h.baseUrl, 'mira@harrowcreek.example', 'a-first-password');
      const labels = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents();
      expect(labels).toEqual(EXPECTED_NAV.operator);
    } finally {
      await page.close();
    }
  });
});
