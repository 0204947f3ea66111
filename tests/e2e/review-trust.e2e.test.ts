// Trusting a review, in Chromium, on the app `npm start` serves: the stage marks, the import
// without units and the empty file, one rule for file sizes, the Panelize help (pitch, overlap,
// fit outline to parts, selects), the fiducials drawn on Align, a selection that does not move
// the canvas, overlays and toasts off the drawing, and Home's next task for each role.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users';
import { fileSize } from '../../src/lib/format';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { SAMPLES } from '../helpers/programs';
import { agent, makeUser, TEST_PASSWORD } from '../helpers/test-app';

let h: BrowserHarness;
let page: Page;
let revId = '';
const PROGRAM = `trust-${Date.now().toString(36)}`;
// weather-ctl.csv: "Ref,Val,Package,PosX,PosY,…" — no unit in the header or on the values
const NO_UNITS = readFileSync(join(SAMPLES, 'weather-station/weather-ctl.csv'));

beforeAll(async () => {
  h = await startBrowserHarness();
  // an e-mail of its own: the browser tests share one database, and makeUser's numbering starts
  // again in every test file
  const author = await makeUser(h.ctx.ds, ['engineer'], { name: 'Tess Marlow', email: `tess-${Date.now().toString(36)}@trust.example` });
  const a = await agent(h.ctx);
  expect((await a.signIn(author)).status).toBe(200);
  const created = await a.a.post('/api/programs').set('X-CSRF-Token', a.token).send({ name: PROGRAM, product: 'Weather-station controller', board: 'WSC-200 rev 3' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  revId = created.body.revisions[0].id;
  page = await h.newPage();
  page.setDefaultTimeout(30_000);
  await signInAs(page, h.baseUrl, author.email, TEST_PASSWORD);
}, 120_000);
afterAll(async () => {
  await page?.close();
  await h?.close();
});

const mark = (stage: string) => page.getByRole('navigation', { name: 'Stages' }).getByRole('link', { name: new RegExp(stage) }).locator('[data-mark]');
const box = async (l: Locator) => (await l.boundingBox())!;
const overlaps = (a: { x: number; y: number; width: number; height: number }, b: { x: number; y: number; width: number; height: number }) =>
  a.x < b.x + b.width - 0.5 && b.x < a.x + a.width - 0.5 && a.y < b.y + b.height - 0.5 && b.y < a.y + a.height - 0.5;

/** Selects in `scope` whose chosen option's text is wider than the room the select gives it. */
async function cutSelects(scope: Locator): Promise<string[]> {
  return scope.evaluate((root) => {
    const g = document.createElement('canvas').getContext('2d')!;
    const out: string[] = [];
    for (const sel of root.querySelectorAll('select')) {
      if (!sel.offsetParent) continue;
      const cs = getComputedStyle(sel);
      g.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
      const text = sel.options[sel.selectedIndex]?.text ?? '';
      // the drop-down arrow takes about 20 px inside the padding (Chromium's menulist, measured)
      const room = sel.clientWidth - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight) - 20;
      for (const o of sel.options) if (g.measureText(o.text).width > room + 0.5) { out.push(`${sel.labels?.[0]?.textContent ?? sel.id}: "${o.text}"`); break; }
      void text;
    }
    return out;
  });
}

describe('review trust in Chromium', () => {
  it('Import: marks say what holds; an empty file and a file without units are explained for the web', async () => {
    await page.goto(`${h.baseUrl}/programs/revisions/${revId}/import`);
    await page.getByRole('heading', { name: 'Centroid file' }).waitFor();
    expect(await mark('Import').getAttribute('data-mark')).toBe('todo');
    expect(await mark('Assign').getAttribute('data-mark')).toBe('todo');

    const input = page.getByLabel(/centroid \(pick-and-place\) file/);
    await input.setInputFiles({ name: 'empty.csv', mimeType: 'text/csv', buffer: Buffer.alloc(0) });
    const empty = page.getByRole('alert', { name: 'The file is empty' });
    await empty.waitFor();
    expect(await page.locator('main').textContent()).not.toMatch(/Bad request/);

    await input.setInputFiles({ name: 'weather-ctl.csv', mimeType: 'text/csv', buffer: NO_UNITS });
    await page.getByRole('alert', { name: 'Choose the units' }).waitFor();
    const text = (await page.locator('main').textContent())!;
    expect(text).toMatch(/Choose the units in Units, on the left/);
    expect(text).not.toMatch(/--units|line 0|no header row|\(not in the file\)/);
    expect(await page.getByLabel('Units', { exact: true }).getAttribute('aria-invalid')).toBe('true');
    await page.screenshot({ path: `${SCREENSHOT_DIR}/trust-import-no-units.png`, fullPage: true });

    await page.getByLabel('Units', { exact: true }).selectOption('mm');
    await page.getByRole('table', { name: 'First rows as read' }).waitFor();
    // one rule for sizes: kB = 1000 bytes
    await page.getByText(fileSize(NO_UNITS.length), { exact: true }).waitFor();
    expect(fileSize(NO_UNITS.length)).toMatch(/^\d+\.\d kB$/);
    await page.getByRole('button', { name: 'Import this file' }).click();
    await page.getByText('Imported:').waitFor();
    // the toast stays in the navigation column (14rem wide), off the page's content
    const toast = page.locator('[data-sonner-toast]').first();
    await toast.waitFor();
    const tb = await box(toast);
    expect(tb.x + tb.width).toBeLessThanOrEqual(224);
    await expect.poll(() => mark('Import').getAttribute('data-mark')).toBe('done');
    // imported, no panel: Assign is not done (it was ✓ here before)
    expect(await mark('Panelize').getAttribute('data-mark')).toBe('todo');
    expect(await mark('Assign').getAttribute('data-mark')).toBe('todo');
    expect(await mark('Verify').getAttribute('data-mark')).toBe('todo');
  });

  it('Panelize: outline fitted to the parts, pitch = board + 2 mm, overlaps warned as typed, no select cuts its text', async () => {
    await page.goto(`${h.baseUrl}/programs/revisions/${revId}/panelize`);
    const extent = page.getByTestId('parts-extent');
    await extent.waitFor();
    expect(await cutSelects(page.locator('main'))).toEqual([]);
    await extent.getByRole('button', { name: 'Fit outline to parts' }).click();
    const width = Number(await page.getByLabel('Width', { exact: true }).inputValue());
    const height = Number(await page.getByLabel('Height', { exact: true }).inputValue());
    // weather-ctl.csv's parts (both sides) span x 28.250…123.000 and y 41.250…118.250 mm (read
    // from the file); 2 mm margin on each side
    expect(width).toBeCloseTo(123 - 28.25 + 4, 3);
    expect(height).toBeCloseTo(118.25 - 41.25 + 4, 3);
    expect(Number(await page.getByLabel('Pitch X').inputValue())).toBeCloseTo(width + 2, 3);
    expect(Number(await page.getByLabel('Pitch Y').inputValue())).toBeCloseTo(height + 2, 3);
    expect(await page.getByRole('alert', { name: 'Panel problems' }).count()).toBe(0);
    await page.getByLabel('Panel width').fill('240');
    await page.getByLabel('Panel height').fill('90');
    // as typed: a pitch smaller than the board stacks the boards
    await page.getByLabel('Pitch X').fill('50');
    await page.getByRole('alert', { name: 'Panel problems' }).getByText(/Boards overlap: 1 and 2/).waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}/trust-panelize-overlap.png`, fullPage: true });
    await page.getByLabel('Pitch X').fill(String(width + 2));
    await expect.poll(() => page.getByRole('alert', { name: 'Panel problems' }).count()).toBe(0);
    await page.getByRole('button', { name: 'Save panel' }).click();
    await expect.poll(() => mark('Panelize').getAttribute('data-mark')).toBe('done');
  });

  it('Align draws the fiducials on the panel as they are typed', async () => {
    await page.goto(`${h.baseUrl}/programs/revisions/${revId}/align`);
    await page.getByRole('button', { name: 'Add a fiducial' }).click();
    await page.getByLabel('Design X').fill('3');
    await page.getByLabel('Design Y').fill('4');
    const drawing = page.getByRole('region', { name: 'Fiducials on the panel' });
    await drawing.getByRole('img', { name: /1 fiducial \(F1\)/ }).waitFor();
    expect(await drawing.locator('[data-fiducial="F1"]').count()).toBe(1);
    await page.screenshot({ path: `${SCREENSHOT_DIR}/trust-align-fiducials.png`, fullPage: true });
  });

  it('selecting on the canvas does not move it; its chrome stays off the drawing', async () => {
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`${h.baseUrl}/panel-preview?sample=faulty`);
    const canvas = page.getByTestId('panel-canvas');
    await page.waitForFunction(() => !!document.querySelector('[data-testid=panel-canvas]')?.getAttribute('data-view'));
    // the canvas's place in the page (a table click may scroll the window: that is not a shift)
    const pageTop = () => canvas.evaluate((e) => e.getBoundingClientRect().top + window.scrollY);
    const before = await pageTop();
    await page.getByRole('table', { name: 'Findings' }).getByRole('row').filter({ hasText: 'body-overlap' }).first().click();
    await page.getByRole('button', { name: /Mark checked: 1 selected finding/ }).waitFor();
    expect(await pageTop()).toBe(before);
    await canvas.scrollIntoViewIfNeeded();
    const after = await box(canvas);
    const aside = await box(page.getByRole('complementary', { name: 'Canvas controls' }));
    for (const l of [page.getByTestId('side-badge'), page.getByTestId('cursor-readout'), page.getByRole('img', { name: /Scale bar/ }), page.getByRole('button', { name: 'Keyboard shortcuts' })]) {
      const b = await box(l);
      expect(overlaps(b, after), await l.evaluate((e) => e.outerHTML.slice(0, 80))).toBe(false);
      expect(overlaps(b, aside)).toBe(false);
    }
    await page.screenshot({ path: `${SCREENSHOT_DIR}/trust-canvas-selection.png` });
  });

  it('Home: the author sees their draft at the stage that comes next', async () => {
    await page.goto(`${h.baseUrl}/`);
    const row = page.getByRole('list', { name: 'Next tasks' }).getByRole('listitem').filter({ hasText: `Continue ${PROGRAM} rev A` });
    await row.waitFor();
    expect(await row.getByRole('link').getAttribute('href')).toBe(`/programs/revisions/${revId}/verify`);
  });
});

describe('Home shows the next task per role', () => {
  it.each([
    ['ellis@harrowcreek.example', /Nothing open: start a program|Continue|Review/],
    ['lena@harrowcreek.example', /proposal|footprint|nothing waiting/],
    ['otto@harrowcreek.example', /No released programs yet|Set up/],
    ['ada@harrowcreek.example', /role|signed in/],
  ])('%s', async (email, expected) => {
    const p = await h.newPage();
    await signInAs(p, h.baseUrl, email, DEMO_PASSWORD);
    const list = p.getByRole('list', { name: 'Next tasks' });
    await list.waitFor();
    expect(await list.textContent()).toMatch(expected);
    expect(await list.getByRole('link').count()).toBeGreaterThan(0);
    await p.screenshot({ path: `${SCREENSHOT_DIR}/trust-home-${email.split('@')[0]}.png`, fullPage: true });
    await p.close();
  });
});
