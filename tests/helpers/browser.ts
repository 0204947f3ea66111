import { mkdtempSync, mkdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { startTestApp, type TestContext } from './test-app';

export const SCREENSHOT_DIR = 'tests/e2e/screenshots';

export interface BrowserHarness {
  ctx: TestContext;
  baseUrl: string;
  browser: BrowserContext;
  newPage(): Promise<Page>;
  close(): Promise<void>;
}

/** The real app on a free loopback port, and Debian's Chromium driven by playwright-core. */
export async function startBrowserHarness(): Promise<BrowserHarness> {
  const ctx = await startTestApp();
  const server: Server = await new Promise((resolve) => {
    const s = ctx.app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const browser = await chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'pw-chromium-')), {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1360, height: 860 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  return {
    ctx,
    baseUrl,
    browser,
    // Each page starts signed out: the persistent context shares cookies between pages.
    async newPage() {
      await browser.clearCookies();
      return browser.newPage();
    },
    async close() {
      await browser.close();
      await new Promise<void>((r) => server.close(() => r()));
      await ctx.close();
    },
  };
}

export async function signInAs(page: Page, baseUrl: string, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}
