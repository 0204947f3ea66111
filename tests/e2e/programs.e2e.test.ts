import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';
import { SAMPLES } from '../helpers/programs';
import { join } from 'node:path';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
});
afterAll(() => h?.close());

describe('a program from upload to released run file, in Chromium', () => {
  it('engineer imports, panelizes, aligns, checks and submits; a second engineer releases; the CSV matches its SHA-256', async () => {
    const page = await h.newPage();
    // Checks run in a worker thread that starts on first use: allow for a slow, busy machine.
    page.setDefaultTimeout(60_000);
    await signInAs(page, h.baseUrl, 'ellis@harrowcreek.example', DEMO_PASSWORD);

    // Programs → new program
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Programs' }).click();
    await page.getByRole('button', { name: 'New program' }).first().click();
    const form = page.getByRole('form', { name: 'New program' });
    await form.getByLabel('Program name').fill('strip-e2e');
    await form.getByLabel('Product').fill('LED status strip');
    await form.getByLabel('Board and design revision').fill('HCI-LS2 rev A');
    await form.getByRole('button', { name: 'Create program' }).click();

    // Import: preview shows the detected dialect and mapping, then import
    await page.getByLabel(/centroid \(pick-and-place\) file/).setInputFiles(join(SAMPLES, 'led-strip/led-strip.csv'));
    await page.getByRole('table', { name: 'First rows as read' }).waitFor();
    await expect(page.getByLabel('Reference').inputValue()).resolves.toBe('Designator');
    await page.getByText('semicolon, decimal comma').waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}/program-import.png`, fullPage: true });
    await page.getByRole('button', { name: 'Import this file' }).click();
    await page.getByText('Imported:').waitFor();

    // Panelize: board, panel, 4 × 5 grid with columns 1 and 3 turned 180°
    await page.getByRole('link', { name: /Panelize/ }).click();
    const fill = async (label: string, v: string) => {
      const f = page.getByLabel(label, { exact: true });
      await f.fill(v);
    };
    await fill('Width', '60');
    await fill('Height', '12');
    await fill('Panel width', '332');
    await fill('Panel height', '80');
    await fill('Rows', '4');
    await fill('Columns', '5');
    await fill('Pitch X', '64');
    await fill('Pitch Y', '16');
    await fill('Offset X', '8');
    await fill('Offset Y', '10');
    for (let row = 0; row < 4; row++) for (const col of [1, 3]) await page.getByRole('gridcell', { name: new RegExp(`row ${row}, column ${col}:`) }).click();
    await page.getByRole('combobox', { name: 'Machine profile' }).selectOption({ index: 1 });
    await page.getByRole('button', { name: 'Save panel' }).click();
    await page.getByText('Saved.').first().waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}/program-panelize.png`, fullPage: true });

    // Align: one panel fiducial, nothing measured (the list stays in panel coordinates)
    await page.getByRole('link', { name: /Align/ }).click();
    await page.getByRole('button', { name: 'Add a fiducial' }).click();
    await page.getByLabel('Design X').fill('4');
    await page.getByLabel('Design Y').fill('4');
    await page.getByRole('button', { name: 'Save fiducials' }).click();
    await page.getByText('No measured fiducial on this side').first().waitFor();

    // Assign: every part has a package
    await page.getByRole('link', { name: /Assign/ }).click();
    await page.getByRole('table', { name: 'Placements' }).waitFor();
    expect(await page.getByText('no package').count()).toBe(0);

    // Verify, then submit
    await page.getByRole('link', { name: /Verify/ }).click();
    await page.getByRole('button', { name: 'Run the checks' }).click();
    await page.getByText('nothing blocks release').waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}/program-verify.png`, fullPage: true });
    await page.getByRole('link', { name: /Release/ }).click();
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(/Waiting for review by another engineer/).waitFor();
    const revisionUrl = page.url();
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();

    // A second engineer approves
    await signInAs(page, h.baseUrl, 'rowan@harrowcreek.example', DEMO_PASSWORD);
    await page.goto(revisionUrl);
    await page.getByRole('button', { name: 'Approve and release' }).click();
    // the release is confirmed in a dialog naming the program and revision
    await page.getByRole('dialog', { name: /^Release .+ revision [A-Z]+\?$/ }).getByRole('button', { name: /^Release / }).click();
    await page.getByRole('region', { name: 'Released files' }).waitFor();
    await page.screenshot({ path: `${SCREENSHOT_DIR}/program-released.png`, fullPage: true });

    const row = page.getByRole('region', { name: 'Released files' }).getByRole('listitem').filter({ hasText: 'SHA-256' }).first();
    const shown = ((await row.textContent()) ?? '').match(/SHA-256 ([0-9a-f]{64})/)?.[1];
    expect(shown).toMatch(/^[0-9a-f]{64}$/);
    const [download] = await Promise.all([page.waitForEvent('download'), row.getByRole('link', { name: 'CSV' }).click()]);
    const text = readFileSync((await download.path())!, 'utf8');
    // shared/placement-list/README.md: the digest covers every byte after the metadata lines.
    const body = text.split('\n').filter((l) => !l.startsWith('# ')).join('\n');
    expect(createHash('sha256').update(body).digest('hex')).toBe(shown);
    expect(text).toContain(`# sha256: ${shown}`);
    await page.close();
  }, 240_000);
});
