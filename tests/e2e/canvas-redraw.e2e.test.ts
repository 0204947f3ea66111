// The canvas must draw again after every change of view or layers, in the bundles people run:
//  - production: the bundle `npm start` serves (scripts/build-client.sh, served by server/index.ts);
//  - development with React's StrictMode (src/main.tsx wraps the app in it): the Vite dev server
//    of `npm run dev`, with /api proxied to the same server process. The dev server is the
//    development build people actually run (scripts/dev.sh), so it is the one tested here.
// "Changed" is measured on the canvas pixels themselves (every Konva layer's bitmap), never on
// the HTML around it: the scale bar and cursor read-out changed even when the drawing was frozen.
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import type { ViteDevServer } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users';
import { freePort } from '../helpers/app-process';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';

let h: BrowserHarness;
let dev: ViteDevServer;
let devUrl = '';
beforeAll(async () => {
  h = await startBrowserHarness();
  const { createServer } = await import('vite');
  const port = await freePort();
  // vite.config.ts as `npm run dev` loads it; only the port and the proxy target differ
  dev = await createServer({
    configFile: 'vite.config.ts',
    logLevel: 'error',
    server: { host: '127.0.0.1', port, strictPort: true, proxy: { '/api': h.baseUrl } },
  });
  await dev.listen();
  devUrl = `http://127.0.0.1:${port}`;
}, 180_000);
afterAll(async () => {
  await dev?.close();
  await h?.close();
});

/** A hash of every layer bitmap of the canvas (FNV-1a over the RGBA bytes). */
async function canvasPixels(page: Page): Promise<string> {
  return page.evaluate(() => {
    const out: string[] = [];
    for (const c of document.querySelectorAll<HTMLCanvasElement>('[data-testid=panel-canvas] canvas')) {
      const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
      let hsh = 0x811c9dc5;
      for (let i = 0; i < d.length; i += 4) {
        hsh ^= d[i] | (d[i + 1] << 8) | (d[i + 2] << 16) | (d[i + 3] << 24);
        hsh = Math.imul(hsh, 0x01000193);
      }
      out.push((hsh >>> 0).toString(16));
    }
    return out.join('.');
  });
}

async function openFaulty(page: Page, base: string) {
  await page.goto(`${base}/panel-preview?sample=faulty`);
  await page.getByTestId('panel-canvas').waitFor({ timeout: 60_000 });
  await page.waitForFunction(() => !!document.querySelector('[data-testid=panel-canvas]')?.getAttribute('data-view'));
  // the sharp redraw 150 ms after the first paint has happened
  await page.waitForTimeout(400);
}

/** Does the drawing change after `act`? Polls the pixels for up to 3 s. */
async function expectRedraw(page: Page, what: string, act: () => Promise<void>) {
  const before = await canvasPixels(page);
  await act();
  await expect.poll(() => canvasPixels(page), { timeout: 3000, message: `the canvas did not redraw after ${what}` }).not.toBe(before);
}

async function exercise(page: Page, base: string, tag: string) {
  await openFaulty(page, base);
  const canvas = page.getByTestId('panel-canvas');
  const box = (await canvas.boundingBox())!;
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  await expectRedraw(page, 'three wheel steps (zoom)', async () => {
    await page.mouse.move(cx, cy);
    for (let k = 0; k < 3; k++) await page.mouse.wheel(0, -200);
  });
  await expectRedraw(page, 'a drag (pan)', async () => {
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    await page.mouse.move(cx + 90, cy + 40, { steps: 6 });
    await page.mouse.up();
  });
  await expectRedraw(page, 'Fit', () => page.getByRole('button', { name: 'Fit' }).click());
  await expectRedraw(page, 'the + key', async () => {
    await canvas.focus();
    await page.keyboard.press('+');
  });
  await expectRedraw(page, 'a layer toggle (Boards off)', () => page.getByRole('group', { name: 'Layers' }).getByRole('checkbox', { name: /Boards/ }).click());
  await expectRedraw(page, 'a layer toggle (Boards on)', () => page.getByRole('group', { name: 'Layers' }).getByRole('checkbox', { name: /Boards/ }).click());
  await canvas.screenshot({ path: `${SCREENSHOT_DIR}/canvas-redraw-${tag}.png` });
}

describe('the canvas redraws after zoom, pan, Fit and layer toggles', () => {
  it('in the production bundle that `npm start` builds and serves', async () => {
    // the bundle in dist/client is the one scripts/build-client.sh made for production, and the
    // server process serves exactly that index.html
    expect(readFileSync('dist/client/.build', 'utf8').trim()).toBe('production');
    const served = await (await fetch(`${h.baseUrl}/sign-in`)).text();
    expect(served).toBe(readFileSync('dist/client/index.html', 'utf8'));
    const page = await h.newPage();
    await signInAs(page, h.baseUrl, 'rowan@harrowcreek.example', DEMO_PASSWORD);
    await exercise(page, h.baseUrl, 'production');
    await page.close();
  });

  it('in the development build with StrictMode (the Vite dev server of `npm run dev`)', async () => {
    const page = await h.newPage();
    await signInAs(page, devUrl, 'rowan@harrowcreek.example', DEMO_PASSWORD);
    // React's development build runs here: the dev server's client script is on the page
    expect(await page.locator('script[src="/@vite/client"]').count()).toBe(1);
    await exercise(page, devUrl, 'development');
    await page.close();
  }, 180_000);
});
