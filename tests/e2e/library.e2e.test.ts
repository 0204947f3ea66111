import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage } from '../../server/db/entities/mail-message.entity';
import { DEMO_PASSWORD } from '../../server/db/seed/demo-users';
import { recordUnmatchedFootprints } from '../../server/modules/library/unmatched.service';
import { SCREENSHOT_DIR, signInAs, startBrowserHarness, type BrowserHarness } from '../helpers/browser';

let h: BrowserHarness;
beforeAll(async () => {
  h = await startBrowserHarness();
  // What a program import would leave behind: footprints of the weather-station board the library does not know.
  await h.ctx.ds.transaction((m) =>
    recordUnmatchedFootprints(m, 'weather-ctl rev B', [
      { footprint: 'BUZZER-12MM-HC', count: 2 },
      { footprint: 'KEYPAD-4X4-HC', count: 1 },
    ]),
  );
});
afterAll(() => h?.close());

const LENA = 'lena@harrowcreek.example';
const ELLIS = 'ellis@harrowcreek.example';
const ADA = 'ada@harrowcreek.example';

async function fillPackage(page: Page, form: ReturnType<Page['getByRole']>, v: { name: string; family: string; l: string; w: string; h: string; rot?: string; aliases?: string; nozzle?: string; tape?: string; pitch?: string }) {
  await form.getByLabel('Name', { exact: true }).fill(v.name);
  await form.getByLabel('Family').selectOption(v.family);
  if (v.aliases !== undefined) await form.getByLabel('Aliases').fill(v.aliases);
  await form.getByLabel('Length', { exact: true }).fill(v.l);
  await form.getByLabel('Width', { exact: true }).fill(v.w);
  await form.getByLabel('Height', { exact: true }).fill(v.h);
  if (v.rot) await form.getByLabel('Rotation offset').fill(v.rot);
  if (v.nozzle) {
    await form.getByLabel('Add a nozzle').selectOption(v.nozzle);
    await form.getByRole('button', { name: 'Add', exact: true }).click();
  }
  if (v.tape) await form.getByLabel('Tape width (mm)').selectOption(v.tape);
  if (v.pitch) await form.getByLabel('Pocket pitch').fill(v.pitch);
}

describe('library in Chromium', () => {
  it('the librarian adds a package with an alias from an unmatched footprint, sees its drawing and exports the library', async () => {
    const page = await h.newPage();
    try {
      await signInAs(page, h.baseUrl, LENA, DEMO_PASSWORD);
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Library' }).click();
      const table = page.getByRole('table', { name: 'Packages' });
      await table.getByText('SOT-23-5', { exact: true }).waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-packages.png` });

      await page.getByRole('navigation', { name: 'Library sections' }).getByRole('link', { name: /Unmatched/ }).click();
      const row = page.getByRole('row').filter({ hasText: 'BUZZER-12MM-HC' });
      await row.waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-unmatched.png` });
      await row.getByRole('button', { name: 'Create package' }).click();

      const form = page.getByRole('form', { name: 'New package' });
      await form.waitFor();
      expect(await form.getByLabel('Name', { exact: true }).inputValue()).toBe('BUZZER-12MM-HC');
      await fillPackage(page, form, { name: 'BUZZER-12', family: 'other', l: '12', w: '12', h: '9.7', rot: '90', aliases: 'BUZZER-12*-ALT', nozzle: 'N40', tape: '24', pitch: '2' });
      // EIA-481 (from memory): a 2 mm pitch exists only on 8 mm tape — said beside the field.
      await form.getByText(/2 mm pocket pitch exists only on 8 mm tape/).waitFor();
      await form.getByLabel('Pocket pitch').fill('16');
      await form.getByLabel('Body offset X').fill('1.5');
      await page.getByRole('figure', { name: 'Package drawing' }).locator('canvas').first().waitFor();
      await page.getByRole('figure', { name: 'Package drawing' }).scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-new-package.png`, fullPage: true });
      await form.getByRole('button', { name: 'Add package' }).click();

      await page.getByRole('heading', { name: 'BUZZER-12' }).waitFor();
      const aliases = page.getByRole('region', { name: 'Aliases of this package' });
      await aliases.getByText('BUZZER-12MM-HC', { exact: true }).waitFor();
      await aliases.getByText('BUZZER-12*-ALT', { exact: true }).waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-package-saved.png`, fullPage: true });

      await page.getByRole('navigation', { name: 'Library sections' }).getByRole('link', { name: /Unmatched/ }).click();
      await page.getByRole('row').filter({ hasText: 'BUZZER-12MM-HC' }).getByText('resolved').waitFor();

      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export library file' }).click()]);
      const text = readFileSync((await download.path())!, 'utf8');
      const file = JSON.parse(text);
      expect(file.format).toBe('placewright-library/1');
      expect(file.packages.find((p: { name: string }) => p.name === 'BUZZER-12')).toMatchObject({ aliases: ['BUZZER-12*-ALT', 'BUZZER-12MM-HC'], rotationOffset: 90, body: { length: 12, offsetX: 1.5 } });
    } finally {
      await page.close();
    }
  });

  it('an engineer’s proposal round-trips with its two e-mails in the Outbox', async () => {
    const eng = await h.newPage();
    try {
      await signInAs(eng, h.baseUrl, ELLIS, DEMO_PASSWORD);
      await eng.goto(`${h.baseUrl}/library/unmatched`);
      await eng.getByRole('row').filter({ hasText: 'KEYPAD-4X4-HC' }).getByRole('button', { name: 'Propose a package' }).click();
      const form = eng.getByRole('form', { name: 'Proposed package' });
      await fillPackage(eng, form, { name: 'KEYPAD-4X4', family: 'connector', l: '20', w: '20', h: '6', nozzle: 'N40', tape: '44', pitch: '24' });
      await form.getByLabel('Note to the librarian').fill('Membrane keypad connector; sizes from the maker drawing HCI-K44.');
      await eng.screenshot({ path: `${SCREENSHOT_DIR}/library-engineer-proposes.png`, fullPage: true });
      await form.getByRole('button', { name: 'Send proposal' }).click();
      await eng.getByRole('list', { name: 'Proposals' }).getByText(/KEYPAD-4X4 for KEYPAD-4X4-HC/).waitFor();
    } finally {
      await eng.close();
    }

    const lib = await h.newPage();
    try {
      await signInAs(lib, h.baseUrl, LENA, DEMO_PASSWORD);
      await lib.goto(`${h.baseUrl}/library/proposals`);
      await lib.getByRole('list', { name: 'Proposals' }).getByText(/KEYPAD-4X4 for KEYPAD-4X4-HC/).click();
      const detail = lib.getByRole('region', { name: /Proposal KEYPAD-4X4/ });
      await detail.getByLabel('Comment to the proposer').fill('Height checked: 6.2 mm with the latch.');
      await detail.getByLabel('Height', { exact: true }).fill('6.2');
      await lib.screenshot({ path: `${SCREENSHOT_DIR}/library-librarian-reviews.png`, fullPage: true });
      await detail.getByRole('button', { name: 'Approve with these values' }).click();
      await detail.getByText('approved', { exact: true }).first().waitFor();
    } finally {
      await lib.close();
    }

    const mails = await h.ctx.ds.getRepository(MailMessage).find({ order: { at: 'ASC' } });
    const subjects = mails.map((m) => m.subject);
    expect(subjects).toEqual(expect.arrayContaining([expect.stringMatching(/^Library proposal: new package KEYPAD-4X4/), expect.stringMatching(/^Your library proposal was approved: new package KEYPAD-4X4/)]));

    const admin = await h.newPage();
    try {
      await signInAs(admin, h.baseUrl, ADA, DEMO_PASSWORD);
      await admin.goto(`${h.baseUrl}/admin/outbox`);
      await admin.getByText(/^Your library proposal was approved/).first().click();
      await admin.getByRole('article', { name: 'Message' }).getByText(/6\.2 mm/).waitFor();
      await admin.getByText(/^Library proposal: new package KEYPAD-4X4/).first().waitFor();
      await admin.screenshot({ path: `${SCREENSHOT_DIR}/library-outbox.png` });
    } finally {
      await admin.close();
    }
  });

  it('operators are not offered the library (their run files carry what they need)', async () => {
    const page = await h.newPage();
    try {
      await signInAs(page, h.baseUrl, 'otto@harrowcreek.example', DEMO_PASSWORD);
      await page.goto(`${h.baseUrl}/library/packages`);
      await page.getByRole('heading', { name: 'Not for your roles' }).waitFor();
      expect(await page.getByRole('table', { name: 'Packages' }).count()).toBe(0);
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-operator-refused.png`, fullPage: true });
    } finally {
      await page.close();
    }
  });
  it('the librarian previews a CSV of packages with a per-row error, and sees the presets and machines', async () => {
    const page = await h.newPage();
    try {
      await signInAs(page, h.baseUrl, LENA, DEMO_PASSWORD);
      await page.goto(`${h.baseUrl}/library/transfer`);
      const csv = ['name,family,length,width,height,nozzles,vision,tapeWidth,tapePitch,aliases', 'LED-2020-HC,chip,2.0,2.0,0.7,N14,chip-medium,8,4,LED2020*', 'FUSE-1812-HC,chip,4.5,3.2,0,N25,chip-large,12,2,'].join('\n');
      await page.getByLabel('CSV file').setInputFiles({ name: 'packages.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
      const preview = page.getByRole('table', { name: 'CSV preview' });
      await preview.getByText(/height: The body height must be more than 0 mm/).waitFor();
      expect(await page.getByRole('button', { name: /Import all 2 rows/ }).isDisabled()).toBe(true);
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-csv-preview.png`, fullPage: true });
      await page.goto(`${h.baseUrl}/library/vision-presets`);
      await page.getByRole('table', { name: 'Vision presets' }).getByText('ball-grid', { exact: true }).waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-vision-presets.png` });
      await page.goto(`${h.baseUrl}/library/machines`);
      await page.getByRole('table', { name: 'Machines' }).getByText('HC line A (desktop)').waitFor();
      await page.screenshot({ path: `${SCREENSHOT_DIR}/library-machines.png` });
    } finally {
      await page.close();
    }
  });
});
