// The canvas overlay in Chromium: linked selection both ways on the Panel preview page, and
// screenshots of the demo samples (top and bottom, zoomed in on labels) for a person to look at.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';

let h: BrowserHarness;
let page: Page;
beforeAll(async () => {
  h = await startBrowserHarness();
  page = await h.newPage();
  await signInAs(page, h.baseUrl, 'rowan@harrowcreek.example', DEMO_PASSWORD);
});
afterAll(async () => {
  await page?.close();
  await h?.close();
});

async function openPreview(sample: string, side: 'top' | 'bottom' = 'top') {
  await page.goto(`${h.baseUrl}/panel-preview?sample=${sample}&side=${side}`);
  await page.getByTestId('panel-canvas').waitFor();
  await page.waitForFunction(() => !!document.querySelector('[data-testid=panel-canvas]')?.getAttribute('data-view'));
  await page.waitForTimeout(150);
}

/** Screen position (page px) of a placement, from its row's X/Y cells and the canvas view (the
 * table is filtered to the reference for a moment, so that its row is rendered). */
async function partOnScreen(rowId: string) {
  const filter = page.getByLabel('Filter placements');
  const before = await filter.inputValue();
  await filter.fill(rowId.split(':')[1]);
  const row = page.locator(`[data-row-id="${rowId}"]`);
  const cells = await row.getByRole('cell').allTextContents();
  await filter.fill(before);
  const x = Number(cells[5]);
  const y = Number(cells[6]);
  const view = (await page.getByTestId('panel-canvas').getAttribute('data-view'))!.split(',').map(Number);
  const box = (await page.getByTestId('panel-canvas').boundingBox())!;
  return { x: box.x + view[1] + view[0] * x, y: box.y + view[2] - view[0] * y };
}

async function zoomAt(x: number, y: number, steps: number) {
  await page.mouse.move(x, y);
  for (let k = 0; k < steps; k++) {
    await page.mouse.wheel(0, -200);
    await page.waitForTimeout(30);
  }
  await page.waitForTimeout(150);
}

describe('canvas overlay in Chromium', () => {
  it('an engineer finds the Panel preview in the navigation', async () => {
    await page.goto(`${h.baseUrl}/`);
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Panel preview' }).click();
    await page.getByRole('heading', { name: 'Panel preview' }).waitFor();
    await page.getByTestId('panel-canvas').waitFor();
    await expect(page.getByTestId('side-badge').textContent()).resolves.toMatch(/Top side · seen from above/);
  });

  it('a click on a part on the canvas highlights its row in the placement table', async () => {
    await openPreview('weather-station');
    const at = await partOnScreen('1:U1');
    await page.mouse.click(at.x, at.y);
    // the row is scrolled into view and highlighted
    const row = page.locator('[data-row-id="1:U1"]');
    await row.waitFor();
    await expect.poll(() => row.getAttribute('aria-selected')).toBe('true');
    await expect(page.getByTestId('panel-canvas').getAttribute('data-selection')).resolves.toBe('1:U1');
    expect(await page.locator('[role=row][aria-selected=true]').count()).toBe(1);
    // the hover card names the part
    await page.mouse.move(at.x + 1, at.y + 1);
    await expect(page.getByTestId('hover-card').textContent()).resolves.toMatch(/U1.*TQFP-48-7x7/);
    await page.screenshot({ path: `${SCREENSHOT_DIR}/canvas-select-weather-top.png`, fullPage: true });
  });

  it('a click on a row selects the part on the canvas, and a box selects several rows', async () => {
    await openPreview('weather-station');
    await page.getByLabel('Filter placements').fill('U5');
    await page.locator('[data-row-id="2:U5"]').click();
    await expect.poll(() => page.getByTestId('panel-canvas').getAttribute('data-selection')).toBe('2:U5');
    await expect(page.locator('[data-row-id="2:U5"]').getAttribute('aria-selected')).resolves.toBe('true');
    await page.getByLabel('Filter placements').fill('');
    // Esc on the canvas clears the selection
    await page.getByTestId('panel-canvas').focus();
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByTestId('panel-canvas').getAttribute('data-selection')).toBe('');
    // Shift + drag around board 1's U1 and U4
    await page.keyboard.press('f');
    const a = await partOnScreen('1:U1');
    const b = await partOnScreen('1:U4');
    await page.keyboard.down('Shift');
    await page.mouse.move(Math.min(a.x, b.x) - 6, Math.min(a.y, b.y) - 6);
    await page.mouse.down();
    await page.mouse.move(Math.max(a.x, b.x) + 6, Math.max(a.y, b.y) + 6, { steps: 4 });
    await page.mouse.up();
    await page.keyboard.up('Shift');
    const sel = (await page.getByTestId('panel-canvas').getAttribute('data-selection'))!.split(' ');
    expect(sel).toEqual(expect.arrayContaining(['1:U1', '1:U4']));
    expect(await page.locator('[data-row-id="1:U1"]').getAttribute('aria-selected')).toBe('true');
  });

  it('a finding row selects its parts, and a click on a part selects its findings', async () => {
    await openPreview('faulty');
    const findings = page.getByRole('table', { name: 'Findings' });
    await findings.getByRole('row').filter({ hasText: 'body-overlap' }).first().click();
    await expect.poll(() => page.getByTestId('panel-canvas').getAttribute('data-selection')).toBe('1:R1 1:R2');
    expect(await page.locator('[data-row-id="1:R1"]').getAttribute('aria-selected')).toBe('true');
    await page.screenshot({ path: `${SCREENSHOT_DIR}/canvas-faulty-finding.png`, fullPage: true });
    await page.getByTestId('panel-canvas').focus();
    await page.keyboard.press('f');
    const at = await partOnScreen('2:U1');
    await page.mouse.click(at.x, at.y);
    await expect.poll(() => findings.locator('tr[aria-selected=true]').count()).toBe(1);
    await expect(findings.locator('tr[aria-selected=true]').textContent()).resolves.toMatch(/out-of-reach.*2:U1/);
  });

  it('the measure tool gives the centre distance of two parts', async () => {
    await openPreview('faulty');
    await page.getByRole('button', { name: 'Measure' }).click();
    // R1 and R2 on board 1: (10, 10) and (11.2, 10) in the board frame → 1.200 mm apart
    await page.getByTestId('panel-canvas').focus();
    const r1 = await partOnScreen('1:R1');
    await zoomAt(r1.x, r1.y, 6);
    const a = await partOnScreen('1:R1');
    const b = await partOnScreen('1:R2');
    await page.mouse.click(a.x - 2, a.y);
    await page.mouse.click(b.x + 2, b.y);
    await expect(page.getByTestId('measure-distance').textContent()).resolves.toBe('1.200 mm');
    await page.screenshot({ path: `${SCREENSHOT_DIR}/canvas-faulty-measure.png` });
  });

  it('a comment is pinned at panel coordinates and listed for the review', async () => {
    await openPreview('led-strip');
    await page.getByRole('button', { name: 'Comment', exact: true }).click();
    const box = (await page.getByTestId('panel-canvas').boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    const form = page.getByRole('form', { name: 'New comment' });
    await form.getByRole('textbox').fill('Boards 2 and 4 turned: confirm against the stencil');
    await form.getByRole('button', { name: 'Pin comment' }).click();
    await page.getByRole('region', { name: 'Comments' }).getByText(/Boards 2 and 4 turned/).waitFor();
    await page.getByRole('region', { name: 'Review summary' }).getByText(/Boards 2 and 4 turned/).waitFor();
    await page.getByTestId('panel-canvas').focus();
    await page.keyboard.press('?');
    await page.getByRole('dialog', { name: 'Keyboard shortcuts' }).waitFor();
    await page.getByTestId('panel-canvas').screenshot({ path: `${SCREENSHOT_DIR}/canvas-led-strip-comment-help.png` });
    await page.keyboard.press('Escape');
  });

  it('an underlay image aligns with two point pairs', async () => {
    await openPreview('faulty');
    // an 800 × 400 px "photo" of the 80 × 40 mm panel at 10 px/mm, upright (pixel v runs down):
    // panel (x, y) mm is pixel (10·x, 400 − 10·y); crosses at panel (10, 10) and (70, 30)
    const dataUrl = await page.evaluate(() => {
      const c = document.createElement('canvas');
      c.width = 800;
      c.height = 400;
      const g = c.getContext('2d')!;
      g.fillStyle = '#2f6f4f';
      g.fillRect(0, 0, 800, 400);
      g.strokeStyle = '#ffffff';
      g.lineWidth = 3;
      g.strokeRect(50, 50, 400, 300); // board 1: panel x 5…45, y 5…35
      g.strokeRect(440, 50, 400, 300); // board 2: x 44…84
      g.fillStyle = '#ffd000';
      for (const [u, v] of [[100, 300], [700, 100]]) g.fillRect(u - 6, v - 6, 12, 12);
      return c.toDataURL('image/png');
    });
    await page.getByLabel('Load an underlay image').setInputFiles({ name: 'faulty-photo.png', mimeType: 'image/png', buffer: Buffer.from(dataUrl.split(',')[1], 'base64') });
    await page.getByText('faulty-photo.png').waitFor();
    await page.getByRole('checkbox', { name: /Underlay image/ }).waitFor();
    // before alignment: the image is stretched over the drawing's bounds (0…84 mm wide),
    // so pixel (u, v) sits at (0.105·u, 0.105·(400 − v)) mm
    const k = 84 / 800;
    const screenOf = async (x: number, y: number) => {
      const view = (await page.getByTestId('panel-canvas').getAttribute('data-view'))!.split(',').map(Number);
      const box = (await page.getByTestId('panel-canvas').boundingBox())!;
      return { x: box.x + view[1] + view[0] * x, y: box.y + view[2] - view[0] * y };
    };
    await page.getByRole('button', { name: 'Align with two points' }).click();
    for (const [[u, v], [x, y]] of [[[100, 300], [10, 10]], [[700, 100], [70, 30]]] as const) {
      const img = await screenOf(k * u, k * (400 - v));
      await page.mouse.click(img.x, img.y);
      const pan = await screenOf(x, y);
      await page.mouse.click(pan.x, pan.y);
    }
    const status = await page.getByText(/^Aligned: /).textContent();
    // 0.1 mm per pixel = 100 µm per pixel, no turn (to the click's pixel rounding)
    const [, um, turn] = status!.match(/Aligned: ([\d.]+) µm per pixel, turned (-?[\d.]+)°/)!;
    expect(Math.abs(Number(um) - 100)).toBeLessThan(1);
    expect(Math.abs(Number(turn))).toBeLessThan(0.5);
    await page.getByLabel('Underlay opacity').fill('0.8');
    await expect(page.getByText('80 %')).toBeTruthy();
    await page.mouse.move(5, 5);
    await page.getByTestId('panel-canvas').screenshot({ path: `${SCREENSHOT_DIR}/canvas-faulty-underlay.png` });
  });

  it.each([
    ['weather-station', 'top', '1:U1'],
    ['weather-station', 'bottom', '1:U7'],
    ['led-strip', 'top', '1:D1'],
    ['led-strip', 'bottom', '2:U1'],
    ['faulty', 'top', '1:C4'],
  ] as const)('screenshots: %s %s side, whole panel and zoomed in on %s', async (sample, side, ref) => {
    await openPreview(sample, side);
    await expect(page.getByTestId('side-badge').textContent()).resolves.toMatch(side === 'top' ? /Top side/ : /Bottom side · seen from below/);
    const canvas = page.getByTestId('panel-canvas');
    await canvas.screenshot({ path: `${SCREENSHOT_DIR}/canvas-${sample}-${side}.png` });
    const at = await partOnScreen(ref);
    await zoomAt(at.x, at.y, sample === 'led-strip' ? 6 : 4);
    await page.mouse.move(5, 5); // off the canvas: no hover card over the labels
    await canvas.screenshot({ path: `${SCREENSHOT_DIR}/canvas-${sample}-${side}-zoom.png` });
  });
});
