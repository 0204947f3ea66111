import { mkdtempSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import type { DataSource } from 'typeorm';
import { inject } from 'vitest';
import { createDataSource } from '../../server/db/data-source';
import { startAppProcess, type AppProcess } from './app-process';
import type { AgentTarget } from './test-app';

export const SCREENSHOT_DIR = 'tests/e2e/screenshots';

/** What a browser test reaches besides the pages: the database, and the server for API agents. */
export interface E2eContext extends AgentTarget {
  ds: DataSource;
  /** the server's base URL (supertest agents take it in place of an app) */
  app: string;
}

export interface BrowserHarness {
  ctx: E2eContext;
  baseUrl: string;
  server: AppProcess;
  browser: BrowserContext;
  newPage(): Promise<Page>;
  close(): Promise<void>;
}

export const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

/** Debian's Chromium, headless, through playwright-core (a fresh profile). */
export function launchChromium(viewport = { width: 1360, height: 860 }): Promise<BrowserContext> {
  return chromium.launchPersistentContext(mkdtempSync(join(tmpdir(), 'pw-chromium-')), {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport,
    args: CHROMIUM_ARGS,
  });
}

/**
 * The app as `npm start` serves it — the server entry (`server/index.ts`) in its own process on a
 * free loopback port, serving the client that scripts/build-client.sh built into dist/client —
 * and Debian's Chromium driven by playwright-core.
 */
export async function startBrowserHarness(): Promise<BrowserHarness> {
  const url = inject('databaseUrl');
  const server = await startAppProcess({ databaseUrl: url });
  const ds = createDataSource(url);
  await ds.initialize();
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const browser = await launchChromium();
  return {
    ctx: { ds, app: server.baseUrl },
    baseUrl: server.baseUrl,
    server,
    browser,
    // Each page starts signed out: the persistent context shares cookies between pages.
    async newPage() {
      await browser.clearCookies();
      return browser.newPage();
    },
    async close() {
      await browser.close();
      await server.stop();
      await ds.destroy();
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
